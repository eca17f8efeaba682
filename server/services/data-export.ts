import { Op } from 'sequelize';
import { Bike, CheckIn, Consent, Consultation, Intake, Message, Payment, PhotoMeasurement, Plan, PlanStep, Refund, RiderProfile, SetupSnapshot, Upload, User } from '../models';
import { presentUser } from '../presenters/user';
import { presentConsent, presentIntake, presentUpload } from '../presenters/intake';
import { presentBike, presentProfile, presentSnapshot } from '../presenters/rider';
import { presentConsultation } from '../presenters/consultation';
import { presentPlan } from '../presenters/plan';
import { presentCheckIn } from '../presenters/care';
import { presentMessage } from './chat';
import { presentReferrals } from './care-views';
import { Referral } from '../models';

/**
 * Everything Saddlestep holds about a rider, as plain JSON (files travel beside it in the archive).
 * A fitter's private notes are the fitter's working notes and are not part of the export; the
 * decision is recorded in DEVELOPERS.md.
 */
export async function collectRiderData(riderId: number) {
  const user = await User.findByPk(riderId);
  if (!user) throw new Error('no such rider');
  const [profile, bikes, intakes, consents, uploads, consultations, plans, checkIns, referrals] = await Promise.all([
    RiderProfile.findByPk(riderId),
    Bike.findAll({ where: { riderId }, order: [['id', 'ASC']] }),
    Intake.findAll({ where: { riderId }, order: [['id', 'ASC']] }),
    Consent.findAll({ where: { userId: riderId }, order: [['id', 'ASC']] }),
    Upload.findAll({ where: { riderId }, order: [['id', 'ASC']] }),
    Consultation.findAll({ where: { riderId }, order: [['id', 'ASC']] }),
    Plan.findAll({ where: { riderId }, order: [['id', 'ASC']] }),
    CheckIn.findAll({ where: { riderId }, order: [['id', 'ASC']] }),
    Referral.findAll({ where: { riderId }, order: [['id', 'ASC']] }),
  ]);
  const consentById = new Map(consents.map((c) => [c.id, c]));
  const consultationIds = consultations.map((c) => c.id);
  const [messages, payments, measurements, snapshots, steps] = await Promise.all([
    consultationIds.length ? Message.findAll({ where: { consultationId: { [Op.in]: consultationIds } }, order: [['consultationId', 'ASC'], ['seq', 'ASC']] }) : [],
    consultationIds.length ? Payment.findAll({ where: { consultationId: { [Op.in]: consultationIds } }, include: [{ model: Refund, as: 'refunds' }] }) : [],
    uploads.length ? PhotoMeasurement.findAll({ where: { uploadId: { [Op.in]: uploads.map((u) => u.id) } } }) : [],
    bikes.length ? SetupSnapshot.findAll({ where: { bikeId: { [Op.in]: bikes.map((b) => b.id) } }, order: [['id', 'ASC']] }) : [],
    plans.length ? PlanStep.findAll({ where: { planId: { [Op.in]: plans.map((p) => p.id) } } }) : [],
  ]);
  return {
    exportedAt: new Date().toISOString(),
    account: presentUser(user),
    profile: presentProfile(profile),
    bikes: bikes.map((bike) => {
      const own = snapshots.filter((s) => s.bikeId === bike.id);
      return { ...presentBike(bike, own.at(-1) ?? null, own.length), snapshots: own.map(presentSnapshot) };
    }),
    intakes: intakes.map((i) => presentIntake(i, i.consentId ? (consentById.get(i.consentId) ?? null) : null, { forRider: true })),
    consents: consents.map(presentConsent),
    uploads: uploads.map((u) => ({ ...presentUpload(u), file: archiveName(u) })),
    photoMeasurements: measurements.map((m) => ({ uploadId: m.uploadId, input: m.input, result: m.result, createdAt: m.createdAt.toISOString() })),
    consultations: consultations.map((c) => presentConsultation(c, {})),
    payments: payments.map((p) => ({ consultationId: p.consultationId, amountMinor: p.amountMinor, refundedMinor: p.refundedMinor, currency: p.currency, status: p.status, createdAt: p.createdAt.toISOString() })),
    messages: messages.map((m) => presentMessage(m)),
    plans: plans.map((p) => presentPlan(p, steps.filter((s) => s.planId === p.id), null)),
    checkIns: checkIns.map(presentCheckIn),
    referrals: await presentReferrals(referrals),
  };
}

/** Where an upload sits inside the export archive. */
export function archiveName(upload: Upload): string {
  return `files/${upload.kind}-${upload.id}.${upload.storageName.split('.').pop()}`;
}
