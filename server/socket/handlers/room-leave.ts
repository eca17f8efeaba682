import { leaveRoomSchema } from '@shared/chat';
import { withAck } from '../ack';
import { consultationRoom } from '../rooms';
import { announcePresence } from '../presence';
import type { HandlerDeps } from '../types';

export function roomLeave({ io, socket, ctx }: HandlerDeps) {
  return withAck(ctx.logger, leaveRoomSchema, async ({ consultationId }) => {
    await socket.leave(consultationRoom(consultationId));
    await announcePresence(io, consultationId);
    return null;
  });
}
