import { Op } from 'sequelize';
import { notFound } from '../errors';
import { Bike, Consultation, FitterNote, PhotoMeasurement, RiderProfile, Upload, User } from '../models';
import { presentIntake, presentUpload } from '../presenters/intake';
import { presentProfile, presentSnapshot } from '../presenters/rider';
import { presentConsultation } from '../presenters/consultation';
import { Consent } from '../models';
import { latestSubmitted } from './intakes';
import { listSnapshots } from './setup-history';
import { recordAudit, type AuditActor } from './audit';

/** The consultation the fitter is assigned to (the only fitter who may open its case), or 404. */
export async function assignedConsultation(fitter: Express.User, consultationId: number): Promise<Consultation> {
  const consultation = await Consultation.findOne({ where: { id: consultationId, fitterId: fitter.id } });
  if (!consultation || ['requested', 'awaiting_payment', 'expired', 'cancelled'].includes(consultation.status)) throw notFound('That consultation');
  return consultation;
}

/** Everything a fitter needs in the room: intake and triage (red flags first), profile, bikes, photos. */
export async function caseFile(fitter: Express.User, consultationId: number, actor: AuditActor) {
  const consultation = await assignedConsultation(fitter, consultationId);
  const [rider, profile, intake, bikes, uploads] = await Promise.all([
    User.findByPk(consultation.riderId),
    RiderProfile.findByPk(consultation.riderId),
    latestSubmitted(consultation.riderId),
    Bike.findAll({ where: { riderId: consultation.riderId, retiredAt: null }, order: [['id', 'ASC']] }),
    Upload.findAll({ where: { riderId: consultation.riderId }, order: [['id', 'ASC']] }),
  ]);
  const consent = intake?.consentId ? await Consent.findByPk(intake.consentId) : null;
  const measured = uploads.length
    ? await PhotoMeasurement.findAll({ where: { uploadId: { [Op.in]: uploads.map((u) => u.id) } }, attributes: ['uploadId'] })
    : [];
  const measuredIds = new Set(measured.map((m) => m.uploadId));
  const bikeViews = await Promise.all(
    bikes.map(async (bike) => {
      const snapshots = await listSnapshots(bike.id);
      return { id: bike.id, name: bike.name, kind: bike.kind, currentSetup: snapshots.at(-1)?.setup ?? null, snapshots: snapshots.map(presentSnapshot) };
    }),
  );
  await recordAudit(actor, { action: 'case.read', subjectType: 'consultation', subjectId: consultation.id, subjectUserId: consultation.riderId });
  return {
    consultation: presentConsultation(consultation, { rider, fitter }),
    rider: rider ? { id: rider.id, displayName: rider.displayName, timeZone: rider.timeZone, profile: presentProfile(profile) } : null,
    intake: intake ? presentIntake(intake, consent, { forRider: false }) : null,
    bikes: bikeViews,
    uploads: uploads.map((u) => ({ ...presentUpload(u), measured: measuredIds.has(u.id) })),
  };
}

export async function listNotes(fitter: Express.User, consultationId: number, actor: AuditActor) {
  const consultation = await assignedConsultation(fitter, consultationId);
  await recordAudit(actor, { action: 'note.read', subjectType: 'consultation', subjectId: consultation.id, subjectUserId: consultation.riderId });
  return FitterNote.findAll({ where: { consultationId: consultation.id, fitterId: fitter.id }, order: [['createdAt', 'ASC']] });
}

export async function addNote(fitter: Express.User, consultationId: number, body: string, actor: AuditActor) {
  const consultation = await assignedConsultation(fitter, consultationId);
  const note = await FitterNote.create({ consultationId: consultation.id, fitterId: fitter.id, body });
  await recordAudit(actor, { action: 'note.create', subjectType: 'note', subjectId: note.id, subjectUserId: consultation.riderId });
  return note;
}
