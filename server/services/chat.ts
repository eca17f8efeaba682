import { Op, UniqueConstraintError } from 'sequelize';
import { CARE_STATES } from '@shared/consultation';
import { HISTORY_PAGE_MAX, type ChatMessage, type ChatCursor as CursorView } from '@shared/chat';
import { badRequest, notFound } from '../errors';
import { ChatCursor, Consent, Consultation, Message, Referral, Upload, User } from '../models';
import type { AppContext } from '../context';
import { physioHasConsentedReferral } from './access';
import { PHYSIO_ACCESS_STATUSES } from './referral-states';

/** Who may take part in a consultation's chat; everyone else is told it does not exist. */
export async function chatMembership(user: { id: number; role: string }, consultationId: number): Promise<Consultation> {
  const consultation = await Consultation.findByPk(consultationId);
  const member = consultation && (consultation.riderId === user.id || consultation.fitterId === user.id || (await isReferredPhysio(user, consultation)));
  if (!consultation || !member || !CARE_STATES.includes(consultation.status)) throw notFound('That consultation');
  return consultation;
}

/**
 * Physios join as a third party through an accepted referral the rider consented to, made on this
 * consultation: a referral from one fitter does not open the rider's other consultations.
 */
async function isReferredPhysio(user: { id: number; role: string }, consultation: Consultation): Promise<boolean> {
  return user.role === 'physio' && (await physioHasConsentedReferral(user.id, consultation.riderId, consultation.id));
}

export function presentMessage(message: Message, attachment?: Upload | null): ChatMessage {
  return {
    id: Number(message.id),
    consultationId: message.consultationId,
    seq: message.seq,
    clientId: message.clientId,
    senderId: message.senderId,
    kind: message.kind,
    body: message.body,
    attachment: attachment ? { id: attachment.id, kind: attachment.kind, view: attachment.view } : null,
    planId: message.planId,
    createdAt: message.createdAt.toISOString(),
  };
}

async function presentAll(messages: Message[]): Promise<ChatMessage[]> {
  const ids = [...new Set(messages.map((m) => m.attachmentId).filter((id): id is number => id !== null))];
  const uploads = ids.length ? await Upload.findAll({ where: { id: { [Op.in]: ids } } }) : [];
  const byId = new Map(uploads.map((u) => [u.id, u]));
  return messages.map((m) => presentMessage(m, m.attachmentId ? byId.get(m.attachmentId) : null));
}

/**
 * Store a message and give it the consultation's next sequence number. The consultation row is
 * locked while the number is taken, so concurrent senders get distinct, gap-free numbers in commit
 * order. A message whose client id was already stored is returned as it was (no duplicate): the
 * unique (consultation, client id) index refuses the insert, the transaction (and its number) is
 * rolled back, and the stored row is returned.
 */
export async function postMessage(
  ctx: AppContext,
  sender: { id: number },
  consultation: Consultation,
  input: { clientId: string; body: string; attachmentId?: number; kind?: Message['kind']; planId?: number | null },
): Promise<{ message: ChatMessage; created: boolean }> {
  let attachment: Upload | null = null;
  if (input.attachmentId !== undefined) {
    // Our decision: photos and clips come from the rider's own upload pipeline (metadata stripped,
    // counted against the rider's limit). Fitters and physios write; they do not attach.
    if (sender.id !== consultation.riderId) throw badRequest('Only the rider adds photos and clips to the chat.', { attachmentId: 'Only the rider adds photos and clips.' });
    attachment = await Upload.findOne({ where: { id: input.attachmentId, riderId: consultation.riderId } });
    if (!attachment) throw badRequest('That file is not one of this rider’s uploads.', { attachmentId: 'Upload the file first, then attach it.' });
  }
  try {
    const message = await ctx.sequelize.transaction(async (transaction) => {
      const locked = await Consultation.findByPk(consultation.id, { transaction, lock: transaction.LOCK.UPDATE, attributes: ['id', 'lastMessageSeq'] });
      const seq = locked!.lastMessageSeq + 1;
      await Consultation.update({ lastMessageSeq: seq }, { where: { id: consultation.id }, transaction, silent: true });
      return Message.create(
        { consultationId: consultation.id, seq, clientId: input.clientId, senderId: sender.id, kind: input.kind ?? 'text', body: input.body, attachmentId: attachment?.id ?? null, planId: input.planId ?? null },
        { transaction },
      );
    });
    // The sender has read their own message.
    await upsertCursor(consultation.id, sender.id, message.seq, message.seq);
    return { message: presentMessage(message, attachment), created: true };
  } catch (error) {
    // Two sends of one client id raced: the loser returns the winner's row.
    if (error instanceof UniqueConstraintError) {
      const winner = await Message.findOne({ where: { consultationId: consultation.id, clientId: input.clientId } });
      if (winner) return { message: (await presentAll([winner]))[0]!, created: false };
    }
    throw error;
  }
}

/** Messages after `afterSeq` in order, one page at a time. */
export async function messagesAfter(consultationId: number, afterSeq: number): Promise<{ messages: ChatMessage[]; hasMore: boolean }> {
  const rows = await Message.findAll({ where: { consultationId, seq: { [Op.gt]: afterSeq } }, order: [['seq', 'ASC']], limit: HISTORY_PAGE_MAX + 1 });
  return { messages: await presentAll(rows.slice(0, HISTORY_PAGE_MAX)), hasMore: rows.length > HISTORY_PAGE_MAX };
}

/** Older messages before `beforeSeq`, returned oldest first. */
export async function messagesBefore(consultationId: number, beforeSeq: number, limit: number): Promise<{ messages: ChatMessage[]; hasMore: boolean }> {
  const rows = await Message.findAll({ where: { consultationId, seq: { [Op.lt]: beforeSeq } }, order: [['seq', 'DESC']], limit: limit + 1 });
  return { messages: await presentAll(rows.slice(0, limit).reverse()), hasMore: rows.length > limit };
}

/** One upsert; GREATEST keeps a cursor monotonic when two tabs report at once. */
async function upsertCursor(consultationId: number, userId: number, deliveredSeq: number, readSeq: number) {
  await ChatCursor.sequelize!.query(
    `INSERT INTO chat_cursors (consultation_id, user_id, delivered_seq, read_seq, updated_at) VALUES (?, ?, ?, ?, NOW())
     ON DUPLICATE KEY UPDATE delivered_seq = GREATEST(delivered_seq, VALUES(delivered_seq)), read_seq = GREATEST(read_seq, VALUES(read_seq)), updated_at = NOW()`,
    { replacements: [consultationId, userId, deliveredSeq, readSeq] },
  );
}

/** Move a delivered/read cursor forward (never back); reading implies delivery. */
export async function advanceCursor(consultationId: number, userId: number, field: 'deliveredSeq' | 'readSeq', seq: number): Promise<CursorView> {
  await upsertCursor(consultationId, userId, seq, field === 'readSeq' ? seq : 0);
  const cursor = await ChatCursor.findOne({ where: { consultationId, userId } });
  return { userId, deliveredSeq: cursor?.deliveredSeq ?? seq, readSeq: cursor?.readSeq ?? 0 };
}

export async function cursorsOf(consultationId: number): Promise<CursorView[]> {
  const rows = await ChatCursor.findAll({ where: { consultationId } });
  return rows.map((r) => ({ userId: r.userId, deliveredSeq: r.deliveredSeq, readSeq: r.readSeq }));
}

/**
 * Everyone who may read this consultation's chat now: rider, fitter, and each physio with an
 * accepted referral on it whose share consent still stands (a withdrawn consent removes them).
 */
export async function chatRecipients(consultation: Consultation): Promise<number[]> {
  const referrals = await Referral.findAll({
    where: { consultationId: consultation.id, physioId: { [Op.ne]: null }, consentId: { [Op.ne]: null }, status: { [Op.in]: [...PHYSIO_ACCESS_STATUSES] } },
    attributes: ['physioId', 'consentId'],
  });
  const standing = referrals.length ? await Consent.findAll({ where: { id: { [Op.in]: referrals.map((r) => r.consentId!) }, withdrawnAt: null }, attributes: ['id'] }) : [];
  const consented = new Set(standing.map((c) => c.id));
  const physioIds = referrals.filter((r) => consented.has(r.consentId!)).map((r) => r.physioId!);
  return [...new Set([consultation.riderId, consultation.fitterId, ...physioIds])];
}

export async function participantsOf(consultation: Consultation) {
  const users = await User.findAll({ where: { id: { [Op.in]: await chatRecipients(consultation) } }, attributes: ['id', 'displayName', 'role'] });
  return users.map((u) => ({ id: u.id, displayName: u.displayName, role: u.role }));
}
