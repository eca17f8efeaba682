import { Op, type Transaction } from 'sequelize';
import { CARE_STATES } from '@shared/consultation';
import { currentConsent } from '@shared/rider';
import type { ReferralUrgency } from '@shared/care';
import { badRequest, conflict, notFound } from '../errors';
import { Consent, Consultation, Referral, Upload, User } from '../models';
import type { AppContext } from '../context';
import { recordAudit, type AuditActor } from './audit';
import { giveConsent } from './consents';
import { assertReferralMove } from './referral-states';
import { scheduleConsentNotice, scheduleReferralEscalation, notifyReferral } from './referral-notices';
import { removeFromConsultation } from '../socket/evict';

/** Referrals still in play for a consultation (a new one is not opened beside them). */
export const OPEN_STATUSES = ['proposed', 'awaiting_consent', 'sent', 'received', 'accepted', 'in_progress'] as const;

/** The physio asked for, or the active physio with the fewest open referrals. */
async function pickPhysio(requested?: number): Promise<User | null> {
  if (requested) {
    const physio = await User.findOne({ where: { id: requested, role: 'physio', status: 'active' } });
    if (!physio) throw badRequest('Choose an active physiotherapist from the list.', { physioId: 'Choose from the list.' });
    return physio;
  }
  const physios = await User.findAll({ where: { role: 'physio', status: 'active' }, order: [['id', 'ASC']] });
  let best: User | null = null;
  let bestLoad = Infinity;
  for (const physio of physios) {
    const load = await Referral.count({ where: { physioId: physio.id, status: { [Op.in]: [...OPEN_STATUSES] } } });
    if (load < bestLoad) [best, bestLoad] = [physio, load];
  }
  return best;
}

async function checkAttachments(riderId: number, ids: number[]) {
  if (ids.length === 0) return;
  const found = await Upload.count({ where: { id: { [Op.in]: ids }, riderId } });
  if (found !== new Set(ids).size) throw badRequest('Share only this rider’s own photos and clips.', { attachmentIds: 'Choose from the rider’s uploads.' });
}

/** The fitter refers from the room. Nothing is shared until the rider agrees. */
export async function createReferral(ctx: AppContext, fitter: Express.User, consultationId: number, input: { urgency: ReferralUrgency; reason: string; findings: string; attachmentIds: number[]; physioId?: number }, actor: AuditActor) {
  const consultation = await Consultation.findOne({ where: { id: consultationId, fitterId: fitter.id } });
  if (!consultation || !CARE_STATES.includes(consultation.status)) throw notFound('That consultation');
  await checkAttachments(consultation.riderId, input.attachmentIds);
  const open = await Referral.findOne({ where: { consultationId, status: { [Op.in]: ['awaiting_consent', 'sent', 'received', 'accepted', 'in_progress'] } } });
  if (open) throw conflict('This case already has an open referral. Follow that one up first.');
  const physio = await pickPhysio(input.physioId);
  const referral = await ctx.sequelize.transaction(async (transaction) => {
    await Referral.update({ status: 'withdrawn' }, { where: { consultationId, status: 'proposed' }, transaction });
    const created = await Referral.create(
      { consultationId, riderId: consultation.riderId, fitterId: fitter.id, physioId: physio?.id ?? null, origin: 'fitter', urgency: input.urgency, status: 'awaiting_consent', reason: input.reason, findings: input.findings, attachmentIds: [...new Set(input.attachmentIds)], consentId: null, decision: null, responseNote: null, limits: null, holdReason: null, declineNote: null, sentAt: null, receivedAt: null, acceptedAt: null, closedAt: null, escalatedAt: null },
      { transaction },
    );
    await recordAudit(actor, { action: 'referral.create', subjectType: 'referral', subjectId: created.id, subjectUserId: consultation.riderId }, { transaction });
    return created;
  });
  await notifyReferral(ctx, referral, 'consent-needed');
  return referral;
}

/**
 * Open a referral from the system: `proposed` (the fitter confirms) after repeated worsening, or
 * `awaiting_consent` at once for an urgent red flag. No second referral while one is open. A
 * referral that starts waiting for the rider's agreement here gets one e-mail to the rider (a
 * scheduled job, so it is sent after commit and exactly once).
 */
export async function openSystemReferral(consultation: Consultation, kind: 'proposal' | 'red-flag', urgency: ReferralUrgency, reason: string, transaction: Transaction): Promise<Referral | null> {
  const open = await Referral.findOne({ where: { consultationId: consultation.id, status: { [Op.in]: [...OPEN_STATUSES] } }, transaction });
  if (open) {
    // An urgent flag raises an open referral's urgency rather than opening another.
    if (kind === 'red-flag' && open.urgency !== 'urgent') {
      const wasProposed = open.status === 'proposed';
      await open.update({ urgency: 'urgent', status: wasProposed ? 'awaiting_consent' : open.status }, { transaction });
      // A proposal was never shown to the rider; now it waits for them. (A fitter's referral already told them.)
      if (wasProposed) await scheduleConsentNotice(open, transaction);
    }
    return open;
  }
  const physio = await pickPhysio();
  const created = await Referral.create(
    { consultationId: consultation.id, riderId: consultation.riderId, fitterId: consultation.fitterId, physioId: physio?.id ?? null, origin: kind === 'red-flag' ? 'red-flag' : 'system', urgency, status: kind === 'red-flag' ? 'awaiting_consent' : 'proposed', reason, findings: '', attachmentIds: [], consentId: null, decision: null, responseNote: null, limits: null, holdReason: null, declineNote: null, sentAt: null, receivedAt: null, acceptedAt: null, closedAt: null, escalatedAt: null },
    { transaction },
  );
  if (created.status === 'awaiting_consent') await scheduleConsentNotice(created, transaction);
  return created;
}

/** The fitter confirms a system proposal, adding findings and what to share. */
export async function confirmProposal(ctx: AppContext, fitter: Express.User, referralId: number, input: { urgency: ReferralUrgency; reason: string; findings: string; attachmentIds: number[]; physioId?: number }, actor: AuditActor) {
  const referral = await Referral.findOne({ where: { id: referralId, fitterId: fitter.id } });
  if (!referral) throw notFound('That referral');
  assertReferralMove(referral.status, 'awaiting_consent');
  await checkAttachments(referral.riderId, input.attachmentIds);
  const physio = input.physioId ? await pickPhysio(input.physioId) : referral.physioId ? null : await pickPhysio();
  await referral.update({ ...input, attachmentIds: [...new Set(input.attachmentIds)], physioId: physio?.id ?? referral.physioId, status: 'awaiting_consent' });
  await recordAudit(actor, { action: 'referral.confirm', subjectType: 'referral', subjectId: referral.id, subjectUserId: referral.riderId });
  await notifyReferral(ctx, referral, 'consent-needed');
  return referral;
}

/** The rider agrees to share: a consent scoped to this referral, then the physio is told. */
export async function consentToReferral(ctx: AppContext, rider: Express.User, referralId: number, version: string, actor: AuditActor) {
  const referral = await ctx.sequelize.transaction(async (transaction) => {
    const found = await Referral.findOne({ where: { id: referralId, riderId: rider.id }, transaction, lock: transaction.LOCK.UPDATE });
    if (!found) throw notFound('That referral');
    assertReferralMove(found.status, 'sent');
    if (!found.physioId) throw conflict('No physiotherapist is available yet; the clinic will assign one and ask you again.');
    if (!currentConsent('share-with-physio')) throw conflict('Sharing is not available yet.');
    const consent = await giveConsent(rider.id, 'share-with-physio', version, actor, { scope: { type: 'referral', id: found.id }, transaction });
    await found.update({ consentId: consent.id, status: 'sent', sentAt: new Date() }, { transaction });
    await scheduleReferralEscalation(found, transaction);
    return found;
  });
  await notifyReferral(ctx, referral, 'sent');
  return referral;
}

/** True while the rider's consent for this referral stands. */
export async function consentStands(referral: Referral): Promise<boolean> {
  if (!referral.consentId) return false;
  const consent = await Consent.findByPk(referral.consentId);
  return Boolean(consent && !consent.withdrawnAt);
}

/**
 * A withdrawn share consent ends the physio's access on the next request; their open sockets must
 * also leave the consultation's room, or they would keep receiving its chat.
 */
export async function closePhysioChatSeat(ctx: AppContext, consent: Consent): Promise<void> {
  const referrals = await Referral.findAll({ where: { consentId: consent.id, physioId: { [Op.ne]: null } } });
  for (const referral of referrals) await removeFromConsultation(ctx.io, referral.physioId!, referral.consultationId);
}

export async function referralsOfConsultation(user: Express.User, consultationId: number) {
  const consultation = await Consultation.findByPk(consultationId);
  if (!consultation || (consultation.riderId !== user.id && consultation.fitterId !== user.id)) throw notFound('That consultation');
  return Referral.findAll({ where: { consultationId }, order: [['id', 'DESC']] });
}
