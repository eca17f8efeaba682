import { Op, QueryTypes } from 'sequelize';
import { CARE_STATES } from '@shared/consultation';
import type { UnreadCount } from '@shared/chat';
import { Consent, Consultation, Message, Referral } from '../models';
import type { AppServer } from '../socket/types';
import { userRoom } from '../socket/rooms';
import { PHYSIO_ACCESS_STATUSES } from './referral-states';

/**
 * Unread = messages from others after the user's read cursor. Their own messages do not count
 * (sending moves their own cursor anyway). One grouped query for any number of consultations.
 */
export async function unreadCounts(userId: number, consultationIds: number[]): Promise<UnreadCount[]> {
  if (consultationIds.length === 0) return [];
  const rows = await Message.sequelize!.query<{ consultationId: number; count: number }>(
    `SELECT m.consultation_id AS consultationId, COUNT(*) AS count
       FROM messages m LEFT JOIN chat_cursors c ON c.consultation_id = m.consultation_id AND c.user_id = ?
      WHERE m.consultation_id IN (?) AND m.seq > COALESCE(c.read_seq, 0) AND (m.sender_id IS NULL OR m.sender_id <> ?)
      GROUP BY m.consultation_id`,
    { replacements: [userId, consultationIds, userId], type: QueryTypes.SELECT },
  );
  const byId = new Map(rows.map((r) => [Number(r.consultationId), Number(r.count)]));
  return consultationIds.map((consultationId) => ({ consultationId, count: byId.get(consultationId) ?? 0 }));
}

/** The consultations whose chat this user may read: their own as rider or fitter, or by a consented referral. */
async function chatConsultationsOf(user: { id: number; role: string }): Promise<number[]> {
  if (user.role === 'physio') {
    const referrals = await Referral.findAll({ where: { physioId: user.id, consentId: { [Op.ne]: null }, status: { [Op.in]: [...PHYSIO_ACCESS_STATUSES] } }, attributes: ['consultationId', 'consentId'] });
    const standing = referrals.length ? await Consent.findAll({ where: { id: { [Op.in]: referrals.map((r) => r.consentId!) }, withdrawnAt: null }, attributes: ['id'] }) : [];
    const ok = new Set(standing.map((c) => c.id));
    const ids = referrals.filter((r) => ok.has(r.consentId!)).map((r) => r.consultationId);
    if (ids.length === 0) return [];
    return (await Consultation.findAll({ where: { id: { [Op.in]: ids }, status: { [Op.in]: [...CARE_STATES] } }, attributes: ['id'] })).map((c) => c.id);
  }
  const rows = await Consultation.findAll({ where: { [Op.or]: [{ riderId: user.id }, { fitterId: user.id }], status: { [Op.in]: [...CARE_STATES] } }, attributes: ['id'] });
  return rows.map((c) => c.id);
}

/** Every consultation with something unread (zeros left out: the badge only needs the others). */
export async function unreadForUser(user: { id: number; role: string }): Promise<UnreadCount[]> {
  return (await unreadCounts(user.id, await chatConsultationsOf(user))).filter((u) => u.count > 0);
}

/** Tell every tab of this user the consultation's current unread count. */
export async function emitUnread(io: AppServer, userId: number, consultationId: number): Promise<void> {
  const [count] = await unreadCounts(userId, [consultationId]);
  io.to(userRoom(userId)).emit('unread:changed', count ?? { consultationId, count: 0 });
}
