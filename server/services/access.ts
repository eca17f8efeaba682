import { Op } from 'sequelize';
import { CARE_STATES } from '@shared/consultation';
import { Consultation } from '../models';

/** The relation between a signed-in user and a rider whose health data they ask for. */
export type HealthDataRelation = 'owner' | 'assigned-fitter' | 'referred-physio' | 'admin-no-access' | 'unrelated';

/**
 * The one place that decides who may see a rider's health data (intake, photos, check-ins, plans):
 * the rider; a fitter with a paid consultation with that rider; a physio with an accepted
 * referral and the rider's consent (added with referrals). Admins manage the clinic but do not
 * read health data. Callers answer 404 (not 403) when this returns false, so the existence of
 * another rider's records is not revealed.
 */
export async function relationToRider(user: Express.User, riderId: number): Promise<HealthDataRelation> {
  if (user.role === 'rider') return user.id === riderId ? 'owner' : 'unrelated';
  if (user.role === 'fitter') {
    const assigned = await Consultation.count({ where: { riderId, fitterId: user.id, status: { [Op.in]: [...CARE_STATES] } } });
    return assigned > 0 ? 'assigned-fitter' : 'unrelated';
  }
  if (user.role === 'physio') {
    return (await physioHasConsentedReferral(user.id, riderId)) ? 'referred-physio' : 'unrelated';
  }
  return 'admin-no-access';
}

export async function mayReadHealthData(user: Express.User, riderId: number): Promise<boolean> {
  const relation = await relationToRider(user, riderId);
  return relation === 'owner' || relation === 'assigned-fitter' || relation === 'referred-physio';
}

/** Referrals arrive with the physio loop; until then no physio has access. */
async function physioHasConsentedReferral(_physioId: number, _riderId: number): Promise<boolean> {
  return false;
}
