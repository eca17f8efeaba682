import { unreadListSchema } from '@shared/chat';
import { withAck } from '../ack';
import type { HandlerDeps } from '../types';
import { unreadForUser } from '../../services/chat-unread';

/** The unread badge's starting point, asked for on every (re)connect. */
export function unreadList({ socket, ctx }: HandlerDeps) {
  return withAck(ctx.logger, unreadListSchema, () => unreadForUser({ id: socket.data.userId, role: socket.data.role }));
}
