import { measurePhoto, type PhotoMeasurementInput } from '@shared/fit/photo';
import { FitInputError } from '@shared/fit/errors';
import { badRequest, notFound } from '../errors';
import { PhotoMeasurement, Upload } from '../models';
import { assignedConsultation } from './case-file';
import { recordAudit, type AuditActor } from './audit';

/** The photo must be one of the consultation's rider's uploads and a photo, not a clip. */
async function photoOfCase(fitter: Express.User, consultationId: number, uploadId: number) {
  const consultation = await assignedConsultation(fitter, consultationId);
  const upload = await Upload.findOne({ where: { id: uploadId, riderId: consultation.riderId } });
  if (!upload) throw notFound('That photo');
  if (upload.kind !== 'photo') throw badRequest('Measurements are made on photos, not clips.');
  return { consultation, upload };
}

/**
 * Save the points a fitter marked. The server recomputes the angles and offset with the shared
 * code (the client's numbers are never stored), and bad geometry answers 400 with the reason.
 */
export async function saveMeasurement(fitter: Express.User, uploadId: number, consultationId: number, input: PhotoMeasurementInput, actor: AuditActor) {
  const { consultation, upload } = await photoOfCase(fitter, consultationId, uploadId);
  let result;
  try {
    result = measurePhoto(input);
  } catch (error) {
    if (error instanceof FitInputError) throw badRequest(error.message, { [`input.${error.field}`]: error.message });
    throw error;
  }
  const measurement = await PhotoMeasurement.create({ uploadId: upload.id, consultationId: consultation.id, createdBy: fitter.id, input, result });
  await recordAudit(actor, { action: 'measurement.create', subjectType: 'upload', subjectId: upload.id, subjectUserId: consultation.riderId });
  return measurement;
}

export async function listMeasurements(fitter: Express.User, uploadId: number, consultationId: number, actor: AuditActor) {
  const { consultation, upload } = await photoOfCase(fitter, consultationId, uploadId);
  await recordAudit(actor, { action: 'measurement.read', subjectType: 'upload', subjectId: upload.id, subjectUserId: consultation.riderId });
  return PhotoMeasurement.findAll({ where: { uploadId: upload.id }, order: [['createdAt', 'DESC']], limit: 20 });
}

export function presentMeasurement(m: PhotoMeasurement) {
  return { id: m.id, uploadId: m.uploadId, consultationId: m.consultationId, createdBy: m.createdBy, input: m.input, result: m.result, createdAt: m.createdAt.toISOString() };
}
