import { receiptSchema } from '@shared/chat';
import { notFound } from '../../errors';
import { withAck } from '../ack';
import { consultationRoom } from '../rooms';
import type { HandlerDeps } from '../types';
import { advanceCursor, chatMembership } from '../../services/chat';
import { emitUnread } from '../../services/chat-unread';

/** `message:delivered` and `message:read`: move the reader's cursor and tell the room. */
export function messageReceipt({ io, socket, ctx }: HandlerDeps, field: 'deliveredSeq' | 'readSeq') {
  return withAck(ctx.logger, receiptSchema, async ({ consultationId, seq }) => {
    if (!socket.rooms.has(consultationRoom(consultationId))) throw notFound('That consultation');
    const consultation = await chatMembership({ id: socket.data.userId, role: socket.data.role }, consultationId);
    const cursor = await advanceCursor(consultationId, socket.data.userId, field, Math.min(seq, consultation.lastMessageSeq));
    io.to(consultationRoom(consultationId)).emit('receipt:updated', { consultationId, ...cursor });
    // The reader's other tabs (and the badge in this one) drop the count they were showing.
    if (field === 'readSeq') await emitUnread(io, socket.data.userId, consultationId);
    return cursor;
  });
}
