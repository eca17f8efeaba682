import { Op } from 'sequelize';
import { Consultation, Intake, Plan, PlanStep, Referral } from '../models';
import { bookingReadiness } from './intake-gate';
import { nextStepBlocker } from './check-ins';
import { todayUtc } from './plan-inputs';

/**
 * The one thing a rider should do next, in the order the care calls for: safety first, then the
 * plan (a pause, a check-in owed, a change ready to make), then the session, then a plan simply
 * under way, then getting ready to book. The home page shows it first; the kinds match `RiderNextAction.vue`.
 */
export type NextActionKind =
  | 'seek_care' | 'plan_on_hold' | 'check_in' | 'apply_step' | 'join_room' | 'session_booked' | 'finish_paying' | 'plan_under_way'
  | 'continue_intake' | 'tell_us_what_hurts' | 'book';

export interface NextAction {
  kind: NextActionKind;
  consultationId?: number;
  planId?: number;
  stepIndex?: number;
}

/** Referrals that have not been answered or ended yet (an urgent one keeps the urgent advice up). */
const UNANSWERED = ['proposed', 'awaiting_consent', 'sent', 'received', 'accepted', 'in_progress'] as const;

/** How long before the start the session room is the next step rather than the booking page. */
const ROOM_OPENS_MINUTES = 15; // our choice: long enough to set the bike on a trainer and join

async function planAction(riderId: number): Promise<NextAction | null> {
  const plan = await Plan.findOne({ where: { riderId, status: { [Op.in]: ['active', 'on_hold'] } }, order: [['id', 'DESC']] });
  if (!plan) return null;
  const ids = { consultationId: plan.consultationId, planId: plan.id };
  if (plan.status === 'on_hold') return { kind: 'plan_on_hold', ...ids };
  const steps = await PlanStep.findAll({ where: { planId: plan.id }, order: [['stepIndex', 'ASC']] });
  const today = todayUtc();
  const lastApplied = [...steps].reverse().find((s) => s.state === 'applied');
  if (lastApplied && !lastApplied.checkedInAt && (lastApplied.overdueAt || (lastApplied.checkInDue && lastApplied.checkInDue <= today))) {
    return { kind: 'check_in', ...ids, stepIndex: lastApplied.stepIndex };
  }
  const current = steps.find((s) => s.state === 'current');
  if (current && current.earliestDate <= today && (current.stepIndex === 1 || (await nextStepBlocker(plan, current.stepIndex - 1)) === null)) {
    return { kind: 'apply_step', ...ids, stepIndex: current.stepIndex };
  }
  // Nothing to do today, but the plan is live: riding on the current setup is the next step.
  return { kind: 'plan_under_way', ...ids };
}

async function sessionAction(riderId: number): Promise<NextAction | null> {
  const now = Date.now();
  const rows = await Consultation.findAll({ where: { riderId, status: { [Op.in]: ['requested', 'awaiting_payment', 'booked', 'in_session'] } }, order: [['startsAt', 'ASC']] });
  for (const c of rows) {
    if (c.status === 'in_session') return { kind: 'join_room', consultationId: c.id };
    if (c.status === 'booked' && c.endsAt.getTime() > now) {
      return { kind: c.startsAt.getTime() - now <= ROOM_OPENS_MINUTES * 60_000 ? 'join_room' : 'session_booked', consultationId: c.id };
    }
    if ((c.status === 'requested' || c.status === 'awaiting_payment') && c.holdExpiresAt && c.holdExpiresAt.getTime() > now) return { kind: 'finish_paying', consultationId: c.id };
  }
  return null;
}

/** Computed from the rider's live data on every request; nothing is stored. */
export async function riderNextAction(riderId: number): Promise<NextAction> {
  const [readiness, urgentReferral, held] = await Promise.all([
    bookingReadiness(riderId),
    Referral.findOne({ where: { riderId, urgency: 'urgent', status: { [Op.in]: [...UNANSWERED] } }, attributes: ['id', 'consultationId'] }),
    Plan.count({ where: { riderId, status: 'on_hold' } }),
  ]);
  if (readiness.code === 'urgent') return { kind: 'seek_care' };
  // A red flag (at a check-in or in updated answers) pauses the plan and opens an urgent referral.
  if (urgentReferral && held > 0) return { kind: 'seek_care', consultationId: urgentReferral.consultationId };
  const fromPlan = await planAction(riderId);
  if (fromPlan && fromPlan.kind !== 'plan_under_way') return fromPlan;
  const fromSession = await sessionAction(riderId);
  if (fromSession) return fromSession;
  if (fromPlan) return fromPlan;
  if (readiness.code === 'ready') return { kind: 'book' };
  // A rider who saved a draft and sent nothing yet picks up where they left off, not from scratch.
  if (readiness.code === 'no-intake' && (await Intake.count({ where: { riderId, status: 'draft' } })) > 0) return { kind: 'continue_intake' };
  return { kind: 'tell_us_what_hurts' };
}
