import { Op } from 'sequelize';
import { Consent, Plan, PlanStep, RiderProfile, Upload, User } from '../models';
import { presentIntake, presentUpload } from '../presenters/intake';
import { presentProfile } from '../presenters/rider';
import { presentPlan } from '../presenters/plan';
import { recordAudit, type AuditActor } from './audit';
import { latestSubmitted } from './intakes';
import { physioReferral } from './physio';
import { presentReferrals, trendFor } from './care-views';

/** The case as the rider consented to share it: intake, check-ins, the live plan and the chosen files. */
export async function physioCase(physio: Express.User, referralId: number, actor: AuditActor) {
  const referral = await physioReferral(physio, referralId, { needsAccess: true });
  const [rider, profile, intake, trend, plan, uploads] = await Promise.all([
    User.findByPk(referral.riderId),
    RiderProfile.findByPk(referral.riderId),
    latestSubmitted(referral.riderId),
    trendFor(referral.riderId, referral.consultationId),
    Plan.findOne({ where: { riderId: referral.riderId, consultationId: referral.consultationId, status: { [Op.in]: ['active', 'on_hold'] } }, order: [['id', 'DESC']] }),
    referral.attachmentIds.length ? Upload.findAll({ where: { id: { [Op.in]: referral.attachmentIds }, riderId: referral.riderId } }) : [],
  ]);
  const consent = intake?.consentId ? await Consent.findByPk(intake.consentId) : null;
  const planView = plan ? presentPlan(plan, await PlanStep.findAll({ where: { planId: plan.id } }), await User.findByPk(plan.fitterId)) : null;
  await recordAudit(actor, { action: 'referral.case_read', subjectType: 'referral', subjectId: referral.id, subjectUserId: referral.riderId });
  return {
    referral: (await presentReferrals([referral]))[0]!,
    rider: rider ? { id: rider.id, displayName: rider.displayName, profile: presentProfile(profile) } : null,
    intake: intake ? presentIntake(intake, consent, { forRider: false }) : null,
    checkIns: trend,
    plan: planView,
    attachments: uploads.map(presentUpload),
  };
}
