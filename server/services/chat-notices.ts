import type { AppContext } from '../context';
import { ChatCursor, Consultation, User } from '../models';
import { scheduleJob } from '../scheduler/jobs';
import type { AppServer } from '../socket/types';
import { isAwayFrom } from '../socket/presence';
import { chatMembership, chatRecipients } from './chat';
import { emitUnread } from './chat-unread';
import { renderMail } from '../mail/layout';
import { publicUrl } from '../mail/booking-mails';

export const CHAT_NOTICE = 'chat-notice';
/** Messages to a person away from the chat within this window share one e-mail. */
const BATCH_MS = 10 * 60_000;
/** Wait a little before mailing, in case they come back online and read it. */
const DELAY_MS = 2 * 60_000;

/**
 * After a new message: every other reader (rider, fitter, a physio with consented access) gets the
 * new unread count in their own room (the badge, wherever they are in the app); those with no
 * socket in this consultation's room are away and get one batched e-mail per window (never one per
 * message).
 */
export async function noticeRecipients(ctx: AppContext, io: AppServer, consultation: Consultation, senderId: number) {
  const recipients = (await chatRecipients(consultation)).filter((id) => id !== senderId);
  for (const userId of recipients) {
    await emitUnread(io, userId, consultation.id);
    if (!(await isAwayFrom(io, userId, consultation.id))) continue;
    const bucket = Math.floor(Date.now() / BATCH_MS);
    await scheduleJob({
      kind: CHAT_NOTICE,
      uniqueKey: `${CHAT_NOTICE}:${consultation.id}:${userId}:${bucket}`,
      runAt: new Date(Date.now() + DELAY_MS),
      payload: { consultationId: consultation.id, userId },
    });
  }
}

/** The job: mail only if there is still something unread. The e-mail holds no message text. */
export async function sendChatNotice(ctx: AppContext, payload: Record<string, unknown>) {
  const consultation = await Consultation.findByPk(Number(payload.consultationId));
  const user = await User.findByPk(Number(payload.userId));
  if (!consultation || !user || user.status !== 'active') return;
  // Access may have ended since (a physio's consent withdrawn, the consultation closed).
  if (!(await chatMembership(user, consultation.id).then(() => true, () => false))) return;
  const cursor = await ChatCursor.findOne({ where: { consultationId: consultation.id, userId: user.id } });
  if ((cursor?.readSeq ?? 0) >= consultation.lastMessageSeq) return;
  const mail = renderMail({
    subject: 'New messages in your Saddlestep consultation',
    paragraphs: [`Hello ${user.displayName},`, 'You have unread messages in a consultation. For your privacy we do not put them in e-mail; open Saddlestep to read them.'],
    action: { label: 'Read your messages', url: `${publicUrl(ctx)}/consultations/${consultation.id}/room` },
  });
  await ctx.mailer.send({ to: user.email, ...mail });
}
