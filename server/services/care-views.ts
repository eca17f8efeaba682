import { Op } from 'sequelize';
import { CheckIn, Consent, Consultation, Intake, Plan, PlanStep, Referral, User } from '../models';
import { presentCheckIn, presentReferral } from '../presenters/care';
import { latestSubmitted } from './intakes';

/**
 * The intake the trend starts from: the latest one submitted before the first plan was made, so
 * updated answers sent later do not move the starting point after the steps; else the latest.
 */
export async function startingIntake(riderId: number, firstPlan: Plan | undefined) {
  const before = firstPlan ? await Intake.findOne({ where: { riderId, status: 'submitted', submittedAt: { [Op.lte]: firstPlan.createdAt } }, order: [['submittedAt', 'DESC'], ['id', 'DESC']] }) : null;
  return before ?? latestSubmitted(riderId);
}

/**
 * Comfort and pain over time for a rider, with a marker at each applied step (for the chart).
 * The baseline's `date` is the intake's submission instant; the client keeps it before the first
 * step and check-in.
 */
export async function trendFor(riderId: number, consultationId?: number) {
  const plans = await Plan.findAll({ where: { riderId, ...(consultationId ? { consultationId } : {}) }, order: [['id', 'ASC']] });
  const planIds = plans.map((p) => p.id);
  const [checkIns, steps, intake] = await Promise.all([
    planIds.length ? CheckIn.findAll({ where: { planId: { [Op.in]: planIds } }, order: [['id', 'ASC']] }) : [],
    planIds.length ? PlanStep.findAll({ where: { planId: { [Op.in]: planIds }, state: 'applied' }, order: [['appliedOn', 'ASC']] }) : [],
    startingIntake(riderId, plans[0]),
  ]);
  const byId = new Map(plans.map((p) => [p.id, p]));
  return {
    baseline: intake
      ? { date: (intake.submittedAt ?? intake.updatedAt).toISOString(), comfort: null, pains: intake.symptoms.filter((s) => s.pain !== undefined).map((s) => ({ region: s.region, pain: s.pain! })) }
      : null,
    checkIns: checkIns.map(presentCheckIn),
    steps: steps.map((s) => {
      const step = byId.get(s.planId)?.plan.steps.find((x) => x.index === s.stepIndex);
      const summary = step?.changes.map((c) => `${c.parameter} ${c.delta > 0 ? '+' : ''}${Math.round(c.delta * 10) / 10}`).join(', ') ?? '';
      return { planId: s.planId, index: s.stepIndex, appliedOn: s.appliedOn, summary };
    }),
  };
}

/** Referrals with names and consent state, for any viewer allowed to see them. */
export async function presentReferrals(rows: Referral[]) {
  const ids = new Set<number>();
  rows.forEach((r) => [r.riderId, r.fitterId, r.physioId].forEach((id) => id && ids.add(id)));
  const users = ids.size ? await User.findAll({ where: { id: { [Op.in]: [...ids] } }, attributes: ['id', 'displayName'] }) : [];
  const names = new Map(users.map((u) => [u.id, u.displayName]));
  const consentIds = rows.map((r) => r.consentId).filter((id): id is number => id !== null);
  const consents = consentIds.length ? await Consent.findAll({ where: { id: { [Op.in]: consentIds } } }) : [];
  const byId = new Map(consents.map((c) => [c.id, c]));
  return rows.map((r) => {
    const consent = r.consentId ? byId.get(r.consentId) : undefined;
    return presentReferral(r, names, { given: Boolean(consent), withdrawn: Boolean(consent?.withdrawnAt) });
  });
}

/** Follow-up lists beyond due/overdue: riders getting worse and referrals waiting for the fitter. */
export async function worseningAndWaiting(fitterId: number) {
  const plans = await Plan.findAll({ where: { fitterId, status: { [Op.in]: ['active', 'on_hold'] } }, attributes: ['id', 'riderId', 'consultationId'] });
  const gettingWorse = [];
  // `urgent`: the check-in reported urgent warning signs (the plan is paused and care comes first).
  for (const plan of plans) {
    const latest = await CheckIn.findOne({ where: { planId: plan.id }, order: [['id', 'DESC']] });
    if (latest && latest.decision !== 'continue' && !latest.reviewedAt) {
      const rider = await User.findByPk(plan.riderId, { attributes: ['id', 'displayName'] });
      gettingWorse.push({ riderId: plan.riderId, riderName: rider?.displayName ?? '', consultationId: plan.consultationId, planId: plan.id, stepIndex: latest.stepIndex, checkInDue: latest.createdAt.toISOString().slice(0, 10), state: 'getting-worse' as const, decision: latest.decision, urgent: latest.analysis.referralLevel === 'urgent', checkInId: latest.id });
    }
  }
  const consultations = await Consultation.findAll({ where: { fitterId }, attributes: ['id'] });
  const waiting = consultations.length
    ? await Referral.findAll({ where: { consultationId: { [Op.in]: consultations.map((c) => c.id) }, status: { [Op.in]: ['proposed', 'declined'] } }, order: [['id', 'DESC']], limit: 50 })
    : [];
  return { gettingWorse, referralsWaiting: await presentReferrals(waiting) };
}
