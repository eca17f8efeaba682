import path from 'node:path';
import type { UploadView } from '@shared/rider';
import { UPLOAD_LIMITS } from '@shared/rider';
import { AppError, notFound } from '../errors';
import { Intake, Upload, User } from '../models';
import type { AppContext } from '../context';
import { recordAudit, type AuditActor } from './audit';
import { mayReadUpload } from './access';
import { findDraft, latestSubmitted } from './intakes';
import { assertSize, detectUpload, processClip, processPhoto } from './upload-content';
import { removeStoredFiles, storedPath, writeStoredFile } from './upload-storage';

export interface ReceivedFile {
  buffer: Buffer;
  size: number;
}

/**
 * Store one photo or clip for the rider. The content is checked (type by its bytes, size by
 * kind) and cleaned before anything is written; the files are written first and the row inserted
 * under a per-rider lock that also enforces the file limit, so a failure leaves neither a row
 * without a file nor a stray file.
 */
export async function createUpload(ctx: AppContext, riderId: number, file: ReceivedFile, view: UploadView, actor: AuditActor): Promise<Upload> {
  const detected = await detectUpload(file.buffer);
  assertSize(detected.kind, file.size);
  const stored = detected.kind === 'photo' ? await processPhoto(file.buffer, detected) : null;
  const clip = detected.kind === 'clip' ? processClip(file.buffer, detected) : null;

  const names: string[] = [];
  try {
    names.push(await writeStoredFile(ctx.config, stored?.data ?? clip!.data, detected.ext));
    if (stored) names.push(await writeStoredFile(ctx.config, stored.thumbnail, 'webp', '.thumb'));
    return await ctx.sequelize.transaction(async (transaction) => {
      await User.findByPk(riderId, { transaction, lock: transaction.LOCK.UPDATE, attributes: ['id'] });
      const count = await Upload.count({ where: { riderId }, transaction });
      if (count >= UPLOAD_LIMITS.filesPerIntake) {
        throw new AppError(413, 'too_many_files', `You can keep up to ${UPLOAD_LIMITS.filesPerIntake} photos and clips. Delete one you no longer need to add another.`);
      }
      const intake = (await findDraft(riderId, transaction)) ?? (await latestSubmitted(riderId, transaction))
        ?? (await Intake.create({ riderId, status: 'draft', symptoms: [], redFlagAnswers: {}, goals: [], goalNotes: '', bikeId: null, triageLevel: null, triage: null, consentId: null, submittedAt: null }, { transaction }));
      const upload = await Upload.create(
        {
          riderId,
          intakeId: intake.id,
          view,
          kind: detected.kind,
          contentType: detected.contentType,
          byteSize: (stored?.data ?? clip!.data).length,
          width: stored?.width ?? null,
          height: stored?.height ?? null,
          storageName: names[0]!,
          thumbnailName: names[1] ?? null,
          metadataStripped: stored ? true : clip!.stripped,
        },
        { transaction },
      );
      await recordAudit(actor, { action: 'upload.create', subjectType: 'upload', subjectId: upload.id, subjectUserId: riderId, detail: { kind: detected.kind, view } }, { transaction });
      return upload;
    });
  } catch (error) {
    await removeStoredFiles(ctx.config, names);
    throw error;
  }
}

/** The rider's own photos and clips, newest first. */
export async function listOwnUploads(riderId: number, actor: AuditActor): Promise<Upload[]> {
  const uploads = await Upload.findAll({ where: { riderId }, order: [['id', 'DESC']] });
  await recordAudit(actor, { action: 'upload.list', subjectType: 'rider', subjectId: riderId, subjectUserId: riderId, detail: { count: uploads.length } });
  return uploads;
}

/** For staff reading an intake: the same rider's uploads (access was checked with the intake). */
export function uploadsOfRider(riderId: number): Promise<Upload[]> {
  return Upload.findAll({ where: { riderId }, order: [['id', 'DESC']] });
}

export async function deleteOwnUpload(ctx: AppContext, riderId: number, uploadId: number, actor: AuditActor): Promise<void> {
  const upload = await Upload.findOne({ where: { id: uploadId, riderId } });
  if (!upload) throw notFound('That file');
  await ctx.sequelize.transaction(async (transaction) => {
    await upload.destroy({ transaction });
    await recordAudit(actor, { action: 'upload.delete', subjectType: 'upload', subjectId: upload.id, subjectUserId: riderId }, { transaction });
  });
  await removeStoredFiles(ctx.config, [upload.storageName, ...(upload.thumbnailName ? [upload.thumbnailName] : [])]);
}

export interface ServedFile {
  /** The upload folder and the stored name apart: send() refuses dotted folders (.data) in a full path. */
  root: string;
  name: string;
  contentType: string;
  downloadName: string;
}

/**
 * A stored file for someone allowed to read the rider's health data (the rider, the assigned
 * fitter, a referred physio); 404 for everyone else, so ids cannot be probed. Every read is audited.
 */
export async function readUploadFile(ctx: AppContext, viewer: Express.User, uploadId: number, variant: 'file' | 'thumbnail', actor: AuditActor): Promise<ServedFile> {
  const upload = await Upload.findByPk(uploadId);
  if (!upload || !(await mayReadUpload(viewer, upload))) throw notFound('That file');
  const thumb = variant === 'thumbnail';
  if (thumb && !upload.thumbnailName) throw notFound('That thumbnail');
  await recordAudit(actor, { action: 'upload.read', subjectType: 'upload', subjectId: upload.id, subjectUserId: upload.riderId, detail: { variant } });
  const name = thumb ? upload.thumbnailName! : upload.storageName;
  return {
    root: path.dirname(storedPath(ctx.config, name)),
    name,
    contentType: thumb ? 'image/webp' : upload.contentType,
    downloadName: `${upload.kind}-${upload.id}${thumb ? '-thumbnail' : ''}.${name.split('.').pop()}`,
  };
}
