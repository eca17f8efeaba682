import type { AppServer } from './types';
import { announcePresence } from './presence';
import { consultationRoom, sessionRoom, userRoom } from './rooms';

/*
 * Called by HTTP services when access ends, so open sockets lose it at once rather than at the
 * next session sweep. `io` is null only while the app is being built; then there are no sockets.
 */

/** Sign-out: close the sockets opened with this browser session (other devices stay signed in). */
export function endSessionSockets(io: AppServer | null, sessionId: string): void {
  io?.in(sessionRoom(sessionId)).disconnectSockets(true);
}

/** Account switched off, role changed or account erased: close every socket of the user. */
export function disconnectUser(io: AppServer | null, userId: number): void {
  io?.in(userRoom(userId)).disconnectSockets(true);
}

/**
 * The user may no longer open this consultation (a physio whose share consent was withdrawn): their
 * sockets leave its room, so they stop receiving its messages; a new `room:join` is refused by the
 * membership check.
 */
export async function removeFromConsultation(io: AppServer | null, userId: number, consultationId: number): Promise<void> {
  if (!io) return;
  io.in(userRoom(userId)).socketsLeave(consultationRoom(consultationId));
  await announcePresence(io, consultationId);
}
