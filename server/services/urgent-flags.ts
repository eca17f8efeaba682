import { Op } from 'sequelize';
import type { Transaction } from 'sequelize';
import type { AppContext } from '../context';
import { Consultation } from '../models';
import { holdRiderPlans } from './plan-holds';
import { openSystemReferral } from './referrals';
import { alertFitter } from './care-alerts';

/**
 * An urgent red flag in a new intake, for a rider already under care: pause every live plan,
 * open an urgent referral on each live consultation and alert the fitter. (At a check-in the
 * check-in service does the same.) The rider sees the urgent advice with the triage result.
 */
export async function actOnUrgentIntake(ctx: AppContext, riderId: number, transaction: Transaction) {
  await holdRiderPlans(ctx, riderId, 'Urgent warning signs were reported. Stop riding and get urgent medical care.', null, transaction);
  const consultations = await Consultation.findAll({ where: { riderId, status: { [Op.in]: ['booked', 'in_session', 'plan_active', 'on_hold'] } }, transaction });
  for (const consultation of consultations) {
    await openSystemReferral(consultation, 'red-flag', 'urgent', 'Urgent warning signs reported in an updated "Tell us what hurts".', transaction);
  }
  transaction.afterCommit(async () => {
    for (const consultation of consultations) {
      const target = { fitterId: consultation.fitterId, riderId, consultationId: consultation.id };
      await alertFitter(ctx, target, 'refer', true).catch((error: unknown) => ctx.logger.error({ err: error }, 'urgent alert failed'));
    }
  });
}
