import type { AppServer } from './types';
import { consultationRoom, userRoom } from './rooms';

/** User ids with at least one socket in the consultation's room. */
export async function onlineIn(io: AppServer, consultationId: number): Promise<number[]> {
  const sockets = await io.in(consultationRoom(consultationId)).fetchSockets();
  return [...new Set(sockets.map((s) => s.data.userId))];
}

export async function announcePresence(io: AppServer, consultationId: number): Promise<void> {
  io.to(consultationRoom(consultationId)).emit('presence:changed', { consultationId, online: await onlineIn(io, consultationId) });
}

/** True when the user has no open socket at all (then they get an e-mail notice instead). */
export async function isOffline(io: AppServer, userId: number): Promise<boolean> {
  return (await io.in(userRoom(userId)).fetchSockets()).length === 0;
}
