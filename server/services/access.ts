import { Op } from 'sequelize';
import { CARE_STATES } from '@shared/consultation';
import { Consent, Consultation, Referral } from '../models';
import { PHYSIO_ACCESS_STATUSES } from './referral-states';

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

/**
 * An accepted (or answered) referral to this physio whose share consent has not been withdrawn;
 * with a consultation id, only a referral made on that consultation counts.
 */
export async function physioHasConsentedReferral(physioId: number, riderId: number, consultationId?: number): Promise<boolean> {
  const where = { physioId, riderId, status: { [Op.in]: [...PHYSIO_ACCESS_STATUSES] }, consentId: { [Op.ne]: null } };
  const referrals = await Referral.findAll({ where: consultationId === undefined ? where : { ...where, consultationId } });
  for (const referral of referrals) {
    const consent = await Consent.findByPk(referral.consentId!);
    if (consent && !consent.withdrawnAt) return true;
  }
  return false;
}

/**
 * Uploads are narrower for physios: only the files the fitter chose to share on a referral the
 * physio may open. Riders and assigned fitters see all of the rider's files.
 */
export async function mayReadUpload(user: Express.User, upload: { id: number; riderId: number }): Promise<boolean> {
  const relation = await relationToRider(user, upload.riderId);
  if (relation === 'owner' || relation === 'assigned-fitter') return true;
  if (relation !== 'referred-physio') return false;
  const referrals = await Referral.findAll({ where: { physioId: user.id, riderId: upload.riderId, status: { [Op.in]: [...PHYSIO_ACCESS_STATUSES] } } });
  for (const referral of referrals) {
    const consent = referral.consentId ? await Consent.findByPk(referral.consentId) : null;
    if (consent && !consent.withdrawnAt && referral.attachmentIds.includes(upload.id)) return true;
  }
  return false;
}
