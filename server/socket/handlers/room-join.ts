import { joinRoomSchema, type RoomState } from '@shared/chat';
import { withAck } from '../ack';
import { consultationRoom } from '../rooms';
import { announcePresence, onlineIn } from '../presence';
import type { HandlerDeps } from '../types';
import { chatMembership, cursorsOf, messagesAfter, participantsOf } from '../../services/chat';

/** Join a consultation's room and catch up on everything after the client's last seen number. */
export function roomJoin({ io, socket, ctx }: HandlerDeps) {
  return withAck(ctx.logger, joinRoomSchema, async ({ consultationId, afterSeq }): Promise<RoomState> => {
    const consultation = await chatMembership({ id: socket.data.userId, role: socket.data.role }, consultationId);
    await socket.join(consultationRoom(consultationId));
    const [page, cursors, participants] = await Promise.all([messagesAfter(consultationId, afterSeq), cursorsOf(consultationId), participantsOf(consultation)]);
    await announcePresence(io, consultationId);
    return { ...page, lastSeq: consultation.lastMessageSeq, cursors, participants, online: await onlineIn(io, consultationId) };
  });
}
