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

/**
 * True when none of the user's sockets is in this consultation's room. The socket opens at sign-in
 * on every page, so "has a socket" says nothing about whether they can see the thread; a rider
 * signed in on another page is away from this chat and gets the e-mail notice.
 */
export async function isAwayFrom(io: AppServer, userId: number, consultationId: number): Promise<boolean> {
  const room = consultationRoom(consultationId);
  return !(await io.in(userRoom(userId)).fetchSockets()).some((s) => s.rooms.has(room));
}
