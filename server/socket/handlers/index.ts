import type { HandlerDeps } from '../types';
import { announcePresence } from '../presence';
import { messageHistory } from './message-history';
import { messageReceipt } from './message-receipt';
import { messageSend } from './message-send';
import { roomJoin } from './room-join';
import { roomLeave } from './room-leave';
import { typingSet } from './typing-set';
import { unreadList } from './unread-list';

/** Bind every event of one connected socket. */
export function registerHandlers(deps: HandlerDeps) {
  const { socket, io } = deps;
  socket.on('room:join', roomJoin(deps));
  socket.on('room:leave', roomLeave(deps));
  socket.on('message:send', messageSend(deps));
  socket.on('message:history', messageHistory(deps));
  socket.on('message:delivered', messageReceipt(deps, 'deliveredSeq'));
  socket.on('message:read', messageReceipt(deps, 'readSeq'));
  socket.on('typing:set', typingSet(deps));
  socket.on('unread:list', unreadList(deps));
  socket.on('disconnecting', () => {
    const rooms = [...socket.rooms].filter((room) => room.startsWith('consultation:'));
    // After the socket has left, tell each room who is still there.
    setImmediate(() => rooms.forEach((room) => void announcePresence(io, Number(room.split(':')[1]))));
  });
}
