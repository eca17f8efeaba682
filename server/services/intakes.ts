import type { Transaction } from 'sequelize';
import { rankFitCauses, screenRedFlags, type Symptom } from '@shared/fit/triage';
import { ageFromBirthYear, type IntakeDraftParsed, type IntakeSubmitParsed, type IntakeView } from '@shared/rider';
import { badRequest, notFound } from '../errors';
import { Bike, Consent, Intake, RiderProfile, Upload, User } from '../models';
import type { StoredTriage } from '../models/intake';
import type { AppContext } from '../context';
import { recordAudit, type AuditActor } from './audit';
import { mayReadHealthData } from './access';
import { actOnUrgentIntake } from './urgent-flags';
import { giveConsent } from './consents';
import { removeStoredFiles } from './upload-storage';

/** How many possible fit causes the fitter sees first; the rest add noise, not insight. */
const CAUSES_KEPT = 6;

/**
 * The triage, always computed here from stored answers with the shared code (a client's own
 * result is never read). Age comes from the profile, for the Ottawa knee rule.
 */
export function computeTriage(symptoms: Symptom[], answers: IntakeView['redFlagAnswers'], birthYear: number | null): StoredTriage {
  const age = ageFromBirthYear(birthYear);
  const screen = screenRedFlags({ answers, symptoms, ...(age === undefined ? {} : { age }) });
  const causes = rankFitCauses(symptoms).slice(0, CAUSES_KEPT).map((c) => ({ cause: c.cause, text: c.text, score: c.score, sources: c.sources }));
  return { level: screen.level, triggers: screen.triggers, advice: screen.advice, causes, computedAt: new Date().toISOString() };
}

/** Serialises a rider's intake writes (one draft at most, even with two tabs open). */
async function lockRider(riderId: number, transaction: Transaction): Promise<void> {
  await User.findByPk(riderId, { transaction, lock: transaction.LOCK.UPDATE, attributes: ['id'] });
}

async function assertOwnBike(riderId: number, bikeId: number | null, transaction: Transaction): Promise<void> {
  if (bikeId === null) return;
  const bike = await Bike.findOne({ where: { id: bikeId, riderId, retiredAt: null }, transaction });
  if (!bike) throw badRequest('Choose one of your own bikes.', { bikeId: 'Choose one of your own bikes.' });
}

export function findDraft(riderId: number, transaction?: Transaction): Promise<Intake | null> {
  return Intake.findOne({ where: { riderId, status: 'draft' }, order: [['id', 'DESC']], transaction });
}

export function latestSubmitted(riderId: number, transaction?: Transaction): Promise<Intake | null> {
  return Intake.findOne({ where: { riderId, status: 'submitted' }, order: [['submittedAt', 'DESC'], ['id', 'DESC']], transaction });
}

/** The open draft and the latest submitted intake; opening them is an audited read. */
export async function riderIntakes(riderId: number, actor: AuditActor): Promise<{ draft: Intake | null; submitted: Intake | null; consents: Map<number, Consent> }> {
  const [draft, submitted] = await Promise.all([findDraft(riderId), latestSubmitted(riderId)]);
  const consentIds = [draft?.consentId, submitted?.consentId].filter((id): id is number => typeof id === 'number');
  const consents = new Map((await Consent.findAll({ where: { id: consentIds } })).map((c) => [c.id, c]));
  if (draft || submitted) {
    await recordAudit(actor, { action: 'intake.read', subjectType: 'intake', subjectId: (submitted ?? draft)!.id, subjectUserId: riderId, detail: { draftId: draft?.id ?? null } });
  }
  return { draft, submitted, consents };
}

/** Save the draft as it stands (loose checks), creating it on first save. */
export async function saveDraft(ctx: AppContext, riderId: number, input: IntakeDraftParsed, actor: AuditActor): Promise<Intake> {
  return ctx.sequelize.transaction(async (transaction) => {
    await lockRider(riderId, transaction);
    await assertOwnBike(riderId, input.bikeId, transaction);
    const values = { symptoms: input.symptoms, redFlagAnswers: input.redFlagAnswers, goals: input.goals, goalNotes: input.goalNotes, bikeId: input.bikeId };
    const existing = await findDraft(riderId, transaction);
    const intake = existing
      ? await existing.update(values, { transaction })
      : await Intake.create({ riderId, status: 'draft', ...values, triageLevel: null, triage: null, consentId: null, submittedAt: null }, { transaction });
    await recordAudit(actor, { action: existing ? 'intake.update' : 'intake.create', subjectType: 'intake', subjectId: intake.id, subjectUserId: riderId }, { transaction });
    return intake;
  });
}

/**
 * Submit: strict answers, the consent recorded with its version, the triage computed from the
 * answers, the draft (if any) becoming the submitted intake. All in one transaction.
 */
export async function submitIntake(ctx: AppContext, riderId: number, input: IntakeSubmitParsed, actor: AuditActor): Promise<{ intake: Intake; consent: Consent }> {
  return ctx.sequelize.transaction(async (transaction) => {
    await lockRider(riderId, transaction);
    await assertOwnBike(riderId, input.bikeId, transaction);
    const profile = await RiderProfile.findByPk(riderId, { transaction });
    const triage = computeTriage(input.symptoms, input.redFlagAnswers, profile?.birthYear ?? null);
    const consent = await giveConsent(riderId, 'store-health-data', input.consent.version, actor, { transaction });
    const values = {
      status: 'submitted' as const,
      symptoms: input.symptoms,
      redFlagAnswers: input.redFlagAnswers,
      goals: input.goals,
      goalNotes: input.goalNotes,
      bikeId: input.bikeId,
      triageLevel: triage.level,
      triage,
      consentId: consent.id,
      submittedAt: new Date(),
    };
    const draft = await findDraft(riderId, transaction);
    const intake = draft ? await draft.update(values, { transaction }) : await Intake.create({ riderId, ...values }, { transaction });
    await recordAudit(actor, { action: 'intake.submit', subjectType: 'intake', subjectId: intake.id, subjectUserId: riderId, detail: { level: triage.level } }, { transaction });
    if (triage.level === 'urgent') await actOnUrgentIntake(ctx, riderId, transaction);
    return { intake, consent };
  });
}

/**
 * Throw away the open draft. Photos made while drafting are kept with the previous submitted
 * intake when there is one (they still show the bike); otherwise they go with the draft.
 */
export async function discardDraft(ctx: AppContext, riderId: number, actor: AuditActor): Promise<void> {
  const orphanFiles = await ctx.sequelize.transaction(async (transaction) => {
    await lockRider(riderId, transaction);
    const draft = await findDraft(riderId, transaction);
    if (!draft) throw notFound('An unfinished intake');
    const previous = await latestSubmitted(riderId, transaction);
    let files: string[] = [];
    if (previous) {
      await Upload.update({ intakeId: previous.id }, { where: { intakeId: draft.id }, transaction });
    } else {
      const uploads = await Upload.findAll({ where: { intakeId: draft.id }, transaction });
      files = uploads.flatMap((u) => [u.storageName, ...(u.thumbnailName ? [u.thumbnailName] : [])]);
      await Upload.destroy({ where: { intakeId: draft.id }, transaction });
    }
    await draft.destroy({ transaction });
    await recordAudit(actor, { action: 'intake.discard', subjectType: 'intake', subjectId: draft.id, subjectUserId: riderId }, { transaction });
    return files;
  });
  // Files go only after the rows are gone for good, so a rollback never leaves rows without files.
  await removeStoredFiles(ctx.config, orphanFiles);
}

/** One intake for anyone allowed to read this rider's health data; everyone else gets 404. */
export async function readIntake(viewer: Express.User, intakeId: number, actor: AuditActor): Promise<{ intake: Intake; consent: Consent | null }> {
  const intake = await Intake.findByPk(intakeId);
  if (!intake || !(await mayReadHealthData(viewer, intake.riderId))) throw notFound('That intake');
  // Staff see only what the rider submitted, never a half-written draft.
  if (intake.status === 'draft' && viewer.id !== intake.riderId) throw notFound('That intake');
  const consent = intake.consentId ? await Consent.findByPk(intake.consentId) : null;
  await recordAudit(actor, { action: 'intake.read', subjectType: 'intake', subjectId: intake.id, subjectUserId: intake.riderId });
  return { intake, consent };
}
