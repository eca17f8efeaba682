import { Op } from 'sequelize';
import { analyseCheckIn, type CheckIn as AnalysisCheckIn } from '@shared/fit/checkin';
import { REFERRAL_ADVICE, type ReferralLevel } from '@shared/fit/triage';
import type { CheckInForm } from '@shared/care';
import { conflict, notFound } from '../errors';
import { CheckIn, Consultation, Plan, PlanStep, RiderProfile } from '../models';
import type { AppContext } from '../context';
import { recordAudit, type AuditActor } from './audit';
import { startingIntake } from './care-views';
import { holdRiderPlans } from './plan-holds';
import { openSystemReferral } from './referrals';
import { alertFitter } from './care-alerts';

const URGENCY_FOR_LEVEL: Record<Exclude<ReferralLevel, 'none'>, 'routine' | 'soon' | 'urgent'> = { 'physio-routine': 'routine', 'physio-soon': 'soon', urgent: 'urgent' };

/** A stored check-in in the analysis's own shape: pain per region, overall comfort and numbness. */
function asAnalysisInput(c: { createdAt: Date; rides: number; comfort: number; numbness: boolean; pains: CheckInForm['pains'] }): AnalysisCheckIn {
  return { date: c.createdAt.toISOString().slice(0, 10), rides: c.rides, comfort: c.comfort, numbness: c.numbness, regions: c.pains.map((p) => ({ region: p.region, pain: p.pain })) };
}

/**
 * The intake the plan started from, as the baseline every check-in is compared with: the same
 * starting point the trend chart draws (startingIntake), so answers updated later do not move it.
 */
async function baselineFor(riderId: number, consultationId: number): Promise<AnalysisCheckIn> {
  const firstPlan = await Plan.findOne({ where: { consultationId }, order: [['id', 'ASC']] });
  const intake = await startingIntake(riderId, firstPlan ?? undefined);
  return {
    date: (intake?.submittedAt ?? new Date()).toISOString().slice(0, 10),
    regions: (intake?.symptoms ?? []).filter((s) => s.pain !== undefined).map((s) => ({ region: s.region, pain: s.pain! })),
  };
}

/** Rides logged on one step so far (the next step needs the step's minimum). */
export async function ridesOnStep(planId: number, stepIndex: number): Promise<number> {
  return (await CheckIn.sum('rides', { where: { planId, stepIndex } })) ?? 0;
}

/**
 * Store a check-in on an applied step and act on the shared analysis: an urgent red flag pauses
 * the plan at once and opens an urgent referral; repeated worsening proposes a referral for the
 * fitter to confirm; anything short of "continue" alerts the fitter.
 */
export async function submitCheckIn(ctx: AppContext, rider: Express.User, planId: number, stepIndex: number, form: CheckInForm, actor: AuditActor) {
  const plan = await Plan.findOne({ where: { id: planId, riderId: rider.id } });
  const step = plan ? await PlanStep.findOne({ where: { planId, stepIndex } }) : null;
  if (!plan || !step) throw notFound('That step');
  if (step.state !== 'applied') throw conflict('Check in after you have made this change and ridden with it.');
  if (plan.status === 'superseded') throw conflict('This plan has been replaced; check in on your current plan.');
  const consultation = (await Consultation.findByPk(plan.consultationId))!;
  const earlier = await CheckIn.findAll({ where: { riderId: rider.id, planId: { [Op.in]: (await Plan.findAll({ where: { consultationId: plan.consultationId }, attributes: ['id'] })).map((p) => p.id) } }, order: [['id', 'ASC']] });
  const profile = await RiderProfile.findByPk(rider.id);
  const now = new Date();
  const current: AnalysisCheckIn = {
    ...asAnalysisInput({ createdAt: now, rides: form.rides, comfort: form.comfort, numbness: form.numbness, pains: form.pains }),
    redFlagAnswers: form.redFlagAnswers,
    symptoms: form.pains.map((p) => ({ region: p.region, pain: p.pain, kind: form.numbness ? 'numb' : 'ache', timing: ['during-ride'], durationDays: 0, numbness: form.numbness, swelling: false, afterCrash: false })),
  };
  const analysis = analyseCheckIn({
    baseline: await baselineFor(rider.id, plan.consultationId),
    previous: earlier.map(asAnalysisInput),
    current,
    ...(profile?.birthYear ? { age: now.getUTCFullYear() - profile.birthYear } : {}),
  });
  const urgent = analysis.referralLevel === 'urgent';

  const result = await ctx.sequelize.transaction(async (transaction) => {
    const checkIn = await CheckIn.create(
      { planId, stepIndex, riderId: rider.id, rides: form.rides, minutesRidden: form.minutesRidden, comfort: form.comfort, pains: form.pains, numbness: form.numbness, note: form.note, redFlagAnswers: form.redFlagAnswers, analysis, decision: analysis.decision, reviewedAt: null, reviewedBy: null },
      { transaction },
    );
    if (!step.checkedInAt) await step.update({ checkedInAt: now }, { transaction });
    let referralId: number | null = null;
    if (urgent) {
      await holdRiderPlans(ctx, rider.id, 'Urgent warning signs were reported at a check-in. Stop riding and get urgent medical care.', null, transaction);
      referralId = (await openSystemReferral(consultation, 'red-flag', 'urgent', 'Urgent warning signs reported at a check-in.', transaction))?.id ?? null;
    } else if (analysis.decision === 'refer' && analysis.referralLevel !== 'none') {
      referralId = (await openSystemReferral(consultation, 'proposal', URGENCY_FOR_LEVEL[analysis.referralLevel], analysis.reasons.map((r) => r.message).join(' ').slice(0, 1000), transaction))?.id ?? null;
    }
    await recordAudit(actor, { action: 'checkin.create', subjectType: 'check_in', subjectId: checkIn.id, subjectUserId: rider.id, detail: { decision: analysis.decision } }, { transaction });
    return { checkIn, referralId };
  });
  if (analysis.decision !== 'continue') await alertFitter(ctx, plan, analysis.decision, urgent);

  await plan.reload();
  const next = await PlanStep.findOne({ where: { planId, stepIndex: stepIndex + 1 } });
  const rides = await ridesOnStep(planId, stepIndex);
  return {
    checkIn: result.checkIn,
    outcome: {
      decision: analysis.decision,
      message: urgent ? REFERRAL_ADVICE.urgent : analysis.reasons[0]?.message ?? 'Everything is the same or better.',
      nextStepUnlocksOn: analysis.decision === 'continue' ? (next?.earliestDate ?? null) : null,
      ridesStillNeeded: Math.max(0, step.minRides - rides),
      referralId: result.referralId,
      planOnHold: plan.status === 'on_hold',
      urgentAdvice: urgent ? REFERRAL_ADVICE.urgent : null,
    },
  };
}

/** The fitter has looked at a check-in that asked for review; the next step may then go ahead. */
export async function reviewCheckIn(fitter: Express.User, checkInId: number, actor: AuditActor) {
  const checkIn = await CheckIn.findByPk(checkInId);
  const plan = checkIn ? await Plan.findOne({ where: { id: checkIn.planId, fitterId: fitter.id } }) : null;
  if (!checkIn || !plan) throw notFound('That check-in');
  if (!checkIn.reviewedAt) await checkIn.update({ reviewedAt: new Date(), reviewedBy: fitter.id });
  await recordAudit(actor, { action: 'checkin.review', subjectType: 'check_in', subjectId: checkIn.id, subjectUserId: checkIn.riderId });
  return checkIn;
}

/**
 * Whether the step after `stepIndex` may be applied: enough rides logged on this step, and every
 * check-in on it that did not say continue has been reviewed by the fitter (a later "continue"
 * does not wipe out an earlier warning nobody looked at). Returns the reason when not.
 */
export async function nextStepBlocker(plan: Plan, stepIndex: number): Promise<string | null> {
  const step = await PlanStep.findOne({ where: { planId: plan.id, stepIndex } });
  if (!step) return null;
  const checkIns = await CheckIn.count({ where: { planId: plan.id, stepIndex } });
  if (checkIns === 0) return 'Check in on the last change first: tell us how your rides have felt.';
  const rides = await ridesOnStep(plan.id, stepIndex);
  if (rides < step.minRides) return `Ride at least ${step.minRides} times on the last change first (${rides} logged so far).`;
  const unreviewed = await CheckIn.count({ where: { planId: plan.id, stepIndex, decision: { [Op.ne]: 'continue' }, reviewedAt: null } });
  if (unreviewed > 0) return 'Your fitter is looking at your check-ins on this change; the next step waits for them.';
  return null;
}
