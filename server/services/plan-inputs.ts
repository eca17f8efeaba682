import { physioLimitsSchema, type PlanInput, type PhysioLimits, type RiddenSetup } from '@shared/fit/planner';
import { conflict, notFound } from '../errors';
import { Op } from 'sequelize';
import { Bike, CheckIn, Plan, Referral, type Consultation, type SetupSnapshot } from '../models';
import { getClinicSettings } from './clinic-settings';
import { latestSubmitted } from './intakes';
import { listSnapshots } from './setup-history';

export const todayUtc = () => new Date().toISOString().slice(0, 10);

/** The planner takes at most this many ridden setups (planInputSchema's `history`). */
const MAX_HISTORY = 500;

/**
 * Setups the rider has ridden, for the revert rule and for the changes made before a plan. Each
 * snapshot was ridden from its date until the next one, so the last entry's `to` is the day the
 * current setup went on: the planner starts step 1 no sooner than the adaptation period after it
 * and counts earlier moves in its windows (shared/fit/planner/prior.ts). A re-measurement that
 * found the same setup moves nothing and is not counted as a change. Rides are only known for the
 * long-standing baseline (the rider's own setup, taken as well ridden); later setups count rides
 * once check-ins log them, so they are never assumed. Only the newest MAX_HISTORY are sent.
 */
export function riddenHistory(snapshots: SetupSnapshot[], adaptationRides: number, ridesBySnapshot: Map<number, number> = new Map()): RiddenSetup[] {
  const recent = snapshots.slice(-(MAX_HISTORY + 1));
  return recent.slice(0, -1).map((snapshot, i) => ({
    setup: snapshot.setup,
    from: snapshot.takenOn,
    to: recent[i + 1]!.takenOn,
    rides: ridesBySnapshot.get(snapshot.id) ?? (snapshot.source === 'baseline' ? adaptationRides : 0),
  }));
}

/**
 * The rider's state now: the worst pain and the warning-sign level from whichever is newer, the
 * latest intake or the latest check-in (a check-in after a change says more about today than the
 * intake before it). The red flags count as cleared once a physio has answered continue (with or
 * without limits) on a referral closed after those answers: the physio has seen them.
 */
export async function currentCondition(riderId: number): Promise<{ pain: number; level: PlanInput['redFlagLevel']; cleared: boolean }> {
  const intake = await latestSubmitted(riderId);
  const checkIn = await CheckIn.findOne({ where: { riderId }, order: [['createdAt', 'DESC'], ['id', 'DESC']] });
  const intakeAt = intake?.submittedAt ?? intake?.createdAt ?? null;
  const fromCheckIn = checkIn !== null && (!intakeAt || checkIn.createdAt > intakeAt);
  const pain = fromCheckIn ? Math.max(0, ...checkIn.pains.map((p) => p.pain)) : Math.max(0, ...(intake?.symptoms ?? []).map((s) => s.pain ?? 0));
  const level = fromCheckIn ? checkIn.analysis.referralLevel : (intake?.triageLevel ?? 'none');
  const since = fromCheckIn ? checkIn.createdAt : intakeAt;
  const answered = level === 'none' || !since
    ? 0
    : await Referral.count({ where: { riderId, status: 'closed', decision: { [Op.in]: ['continue', 'continue_with_limits'] }, closedAt: { [Op.gt]: since } } });
  return { pain, level, cleared: answered > 0 };
}

/**
 * Limits physios set on this rider: the newest answered referral that set limits, plus a hold
 * while any plan of the rider is paused. The planner and the server's plan check always apply them.
 */
export async function physioLimitsFor(riderId: number, clearedRedFlags = false): Promise<PhysioLimits | undefined> {
  const withLimits = await Referral.findOne({ where: { riderId, status: 'closed', decision: 'continue_with_limits' }, order: [['closedAt', 'DESC']] });
  const held = await Plan.count({ where: { riderId, status: 'on_hold' } });
  if (!withLimits && held === 0 && !clearedRedFlags) return undefined;
  return physioLimitsSchema.parse({ ...(withLimits?.limits ?? {}), hold: held > 0, clearedRedFlags });
}

/**
 * Everything the planner needs, built on the server from stored facts only: the bike's current
 * setup, the clinic's policy, the rider's pain and red flags, physio limits and ridden history.
 * The client previews with the same inputs; the server re-checks a sent plan against these.
 */
export async function buildPlanInputs(consultation: Consultation, bikeId: number, options: { target?: PlanInput['target']; startDate?: string } = {}) {
  const bike = await Bike.findOne({ where: { id: bikeId, riderId: consultation.riderId } });
  if (!bike) throw notFound('That bike');
  const snapshots = await listSnapshots(bike.id);
  const current = snapshots[snapshots.length - 1];
  if (!current) throw conflict('This bike has no recorded setup yet. Ask the rider to record it first.');
  const settings = await getClinicSettings();
  const { pain, level, cleared } = await currentCondition(consultation.riderId);
  const physio = await physioLimitsFor(consultation.riderId, cleared);
  const today = todayUtc();
  // The planner itself moves step 1 past the adaptation period of the last change in `history`.
  const startDate = options.startDate && options.startDate > today ? options.startDate : today;
  const inputs: PlanInput & { startDate: string } = {
    baseline: current.setup,
    target: options.target ?? current.setup,
    policy: settings.planner,
    currentPain: pain,
    redFlagLevel: level,
    ...(physio ? { physio } : {}),
    startDate,
    history: riddenHistory(snapshots, settings.planner.adaptationRides),
  };
  return { bike, snapshots, current, inputs };
}
