import { Op } from 'sequelize';
import { addDays } from '@shared/fit/setup';
import { Plan, PlanStep, User } from '../models';
import { todayUtc } from './plan-inputs';
import { worseningAndWaiting } from './care-views';

/** How many days ahead a check-in shows as "due" on the fitter's Today page. */
const DUE_SOON_DAYS = 2;

export interface FollowUpItem {
  riderId: number;
  riderName: string;
  consultationId: number;
  planId: number;
  stepIndex: number;
  checkInDue: string;
  state: 'due' | 'overdue';
}

/**
 * The fitter's follow-ups: applied steps whose check-in is due soon or overdue, across the
 * fitter's active plans; riders whose last check-in was not "continue"; referrals waiting on the fitter.
 */
export async function followUpsFor(fitter: Express.User) {
  const plans = await Plan.findAll({ where: { fitterId: fitter.id, status: { [Op.in]: ['active', 'completed', 'on_hold'] } }, attributes: ['id', 'riderId', 'consultationId'] });
  const extra = await worseningAndWaiting(fitter.id);
  if (plans.length === 0) return { due: [], overdue: [], ...extra };
  const steps = await PlanStep.findAll({
    where: { planId: { [Op.in]: plans.map((p) => p.id) }, state: 'applied', checkedInAt: null, checkInDue: { [Op.lte]: addDays(todayUtc(), DUE_SOON_DAYS) } },
    order: [['checkInDue', 'ASC']],
  });
  const riders = await User.findAll({ where: { id: { [Op.in]: [...new Set(plans.map((p) => p.riderId))] } }, attributes: ['id', 'displayName'] });
  const names = new Map(riders.map((r) => [r.id, r.displayName]));
  const byPlan = new Map(plans.map((p) => [p.id, p]));
  const items: FollowUpItem[] = steps.map((s) => {
    const plan = byPlan.get(s.planId)!;
    return { riderId: plan.riderId, riderName: names.get(plan.riderId) ?? '', consultationId: plan.consultationId, planId: plan.id, stepIndex: s.stepIndex, checkInDue: s.checkInDue!, state: s.overdueAt ? 'overdue' : 'due' };
  });
  return { due: items.filter((i) => i.state === 'due'), overdue: items.filter((i) => i.state === 'overdue'), ...extra };
}
