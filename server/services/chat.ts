import { Op, UniqueConstraintError } from 'sequelize';
import { CARE_STATES } from '@shared/consultation';
import { HISTORY_PAGE_MAX, type ChatMessage, type ChatCursor as CursorView } from '@shared/chat';
import { badRequest, notFound } from '../errors';
import { ChatCursor, Consultation, Message, Referral, Upload, User } from '../models';
import type { AppContext } from '../context';
import { physioHasConsentedReferral } from './access';

/** Who may take part in a consultation's chat; everyone else is told it does not exist. */
export async function chatMembership(user: { id: number; role: string }, consultationId: number): Promise<Consultation> {
  const consultation = await Consultation.findByPk(consultationId);
  const member = consultation && (consultation.riderId === user.id || consultation.fitterId === user.id || (await isReferredPhysio(user, consultation)));
  if (!consultation || !member || !CARE_STATES.includes(consultation.status)) throw notFound('That consultation');
  return consultation;
}

/** Physios join as a third party through an accepted referral the rider consented to. */
async function isReferredPhysio(user: { id: number; role: string }, consultation: Consultation): Promise<boolean> {
  return user.role === 'physio' && (await physioHasConsentedReferral(user.id, consultation.riderId));
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
 * order. A message whose client id was already stored is returned as it was (no duplicate).
 */
export async function postMessage(
  ctx: AppContext,
  sender: { id: number },
  consultation: Consultation,
  input: { clientId: string; body: string; attachmentId?: number; kind?: Message['kind']; planId?: number | null },
): Promise<{ message: ChatMessage; created: boolean }> {
  const existing = await Message.findOne({ where: { consultationId: consultation.id, clientId: input.clientId } });
  if (existing) return { message: (await presentAll([existing]))[0]!, created: false };
  let attachment: Upload | null = null;
  if (input.attachmentId !== undefined) {
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
    await advanceCursor(consultation.id, sender.id, 'readSeq', message.seq);
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

/** Move a delivered/read cursor forward (never back); reading implies delivery. */
export async function advanceCursor(consultationId: number, userId: number, field: 'deliveredSeq' | 'readSeq', seq: number): Promise<CursorView> {
  const [cursor] = await ChatCursor.findOrCreate({ where: { consultationId, userId }, defaults: { consultationId, userId, deliveredSeq: 0, readSeq: 0 } });
  const deliveredSeq = Math.max(cursor.deliveredSeq, seq);
  const readSeq = field === 'readSeq' ? Math.max(cursor.readSeq, seq) : cursor.readSeq;
  if (deliveredSeq !== cursor.deliveredSeq || readSeq !== cursor.readSeq) {
    // A conditional update keeps the cursor monotonic when two tabs report at once.
    await ChatCursor.update({ deliveredSeq, readSeq }, { where: { consultationId, userId, deliveredSeq: { [Op.lte]: deliveredSeq }, readSeq: { [Op.lte]: readSeq } } });
  }
  return { userId, deliveredSeq, readSeq };
}

export async function cursorsOf(consultationId: number): Promise<CursorView[]> {
  const rows = await ChatCursor.findAll({ where: { consultationId } });
  return rows.map((r) => ({ userId: r.userId, deliveredSeq: r.deliveredSeq, readSeq: r.readSeq }));
}

export async function participantsOf(consultation: Consultation) {
  const physioIds = (await Referral.findAll({ where: { consultationId: consultation.id, physioId: { [Op.ne]: null }, status: { [Op.in]: ['accepted', 'in_progress', 'closed'] } }, attributes: ['physioId'] })).map((r) => r.physioId!);
  const users = await User.findAll({ where: { id: { [Op.in]: [consultation.riderId, consultation.fitterId, ...physioIds] } }, attributes: ['id', 'displayName', 'role'] });
  return users.map((u) => ({ id: u.id, displayName: u.displayName, role: u.role }));
}
