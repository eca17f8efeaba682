import { sendMessageSchema } from '@shared/chat';
import { AppError, notFound } from '../../errors';
import { withAck } from '../ack';
import { consultationRoom } from '../rooms';
import type { HandlerDeps } from '../types';
import { chatMembership, postMessage } from '../../services/chat';
import { noticeRecipients } from '../../services/chat-notices';

/**
 * Store, then acknowledge, then broadcast. The ack is sent only after the row is committed, so a
 * client that saw OK knows the message is safe; a client that saw nothing resends the same client id.
 */
export function messageSend({ io, socket, ctx, sendLimiter }: HandlerDeps) {
  return withAck(ctx.logger, sendMessageSchema, async (input) => {
    if (!socket.rooms.has(consultationRoom(input.consultationId))) throw notFound('That consultation');
    if (!sendLimiter.take(socket.data.userId)) throw new AppError(429, 'rate_limited', 'You are sending messages too quickly. Wait a moment and try again.');
    const consultation = await chatMembership({ id: socket.data.userId, role: socket.data.role }, input.consultationId);
    // Store and broadcast in one ordered task per consultation, so broadcasts leave in seq order.
    const { message, created } = await ctx.runInOrder(consultationRoom(consultation.id), async () => {
      const stored = await postMessage(ctx, { id: socket.data.userId }, consultation, { clientId: input.clientId, body: input.body, attachmentId: input.attachmentId });
      if (stored.created) socket.to(consultationRoom(consultation.id)).emit('message:created', stored.message);
      return stored;
    });
    if (created) {
      socket.to(consultationRoom(consultation.id)).emit('typing:changed', { consultationId: consultation.id, userId: socket.data.userId, typing: false });
      await noticeRecipients(ctx, io, consultation, socket.data.userId);
    }
    return message;
  });
}
