import type { ConsentView, IntakeView, UploadViewModel } from '@shared/rider';
import type { Consent, Intake, Upload } from '../models';

export function presentConsent(consent: Consent): ConsentView {
  return {
    id: consent.id,
    kind: consent.kind,
    version: consent.version,
    textHash: consent.textHash,
    givenAt: consent.givenAt.toISOString(),
    withdrawnAt: consent.withdrawnAt ? consent.withdrawnAt.toISOString() : null,
  };
}

/**
 * The intake as its reader may see it. The ranked fit causes are suggestions for the fitter and
 * physio; the rider's own view leaves them out so nothing on the rider's screen reads as a finding.
 */
export function presentIntake(intake: Intake, consent: Consent | null, options: { forRider: boolean }): IntakeView {
  const triage = intake.triage ? { ...intake.triage } : null;
  if (triage && options.forRider) delete triage.causes;
  return {
    id: intake.id,
    riderId: intake.riderId,
    status: intake.status,
    symptoms: intake.symptoms,
    redFlagAnswers: intake.redFlagAnswers,
    goals: intake.goals,
    goalNotes: intake.goalNotes,
    bikeId: intake.bikeId,
    triage,
    consent: consent ? presentConsent(consent) : null,
    submittedAt: intake.submittedAt ? intake.submittedAt.toISOString() : null,
    createdAt: intake.createdAt.toISOString(),
    updatedAt: intake.updatedAt.toISOString(),
  };
}

export function presentUpload(upload: Upload): UploadViewModel {
  return {
    id: upload.id,
    intakeId: upload.intakeId,
    view: upload.view,
    kind: upload.kind,
    contentType: upload.contentType,
    byteSize: upload.byteSize,
    width: upload.width,
    height: upload.height,
    metadataStripped: upload.metadataStripped,
    createdAt: upload.createdAt.toISOString(),
    url: `/api/uploads/${upload.id}/file`,
    thumbnailUrl: upload.thumbnailName ? `/api/uploads/${upload.id}/thumbnail` : null,
  };
}
