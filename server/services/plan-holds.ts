import { Op, type Transaction } from 'sequelize';
import type { AppContext } from '../context';
import { Consultation, Plan } from '../models';
import { transitionConsultation } from './consultation-states';

/**
 * Pause every live plan of a rider: no step can be applied while a plan is on hold, and both
 * rider and fitter see `reason`. The consultation moves to `on_hold` too.
 */
export async function holdRiderPlans(ctx: AppContext, riderId: number, reason: string, actorId: number | null, transaction: Transaction) {
  const plans = await Plan.findAll({ where: { riderId, status: 'active' }, transaction, lock: transaction.LOCK.UPDATE });
  for (const plan of plans) await plan.update({ status: 'on_hold', holdReason: reason.slice(0, 500) }, { transaction });
  const consultations = await Consultation.findAll({ where: { riderId, status: { [Op.in]: ['plan_active', 'in_session'] } }, transaction, lock: transaction.LOCK.UPDATE });
  for (const consultation of consultations) await transitionConsultation(ctx, consultation, 'on_hold', { actorId, note: reason, transaction });
  return plans.length;
}

/** Lift a hold: plans go back to active and their consultations to `plan_active`. */
export async function clearRiderHold(ctx: AppContext, riderId: number, note: string, actorId: number, transaction: Transaction) {
  const plans = await Plan.findAll({ where: { riderId, status: 'on_hold' }, transaction, lock: transaction.LOCK.UPDATE });
  for (const plan of plans) await plan.update({ status: 'active', holdReason: null }, { transaction });
  const consultations = await Consultation.findAll({ where: { riderId, status: 'on_hold' }, transaction, lock: transaction.LOCK.UPDATE });
  for (const consultation of consultations) await transitionConsultation(ctx, consultation, 'plan_active', { actorId, note, transaction });
  return plans.length;
}
