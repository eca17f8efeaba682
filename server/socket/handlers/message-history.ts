import { historySchema } from '@shared/chat';
import { withAck } from '../ack';
import type { HandlerDeps } from '../types';
import { chatMembership, messagesBefore } from '../../services/chat';

/** Older pages of the thread, for scrolling back. */
export function messageHistory({ socket, ctx }: HandlerDeps) {
  return withAck(ctx.logger, historySchema, async ({ consultationId, beforeSeq, limit }) => {
    await chatMembership({ id: socket.data.userId, role: socket.data.role }, consultationId);
    return messagesBefore(consultationId, beforeSeq, limit);
  });
}
