import { Op } from 'sequelize';
import type { Ack } from '@shared/http';
import { Session, User } from '../models';
import type { AppContext } from '../context';
import { chatMembership } from '../services/chat';
import { announcePresence } from './presence';
import { consultationRoom } from './rooms';
import type { AppServer, AppSocket } from './types';

/**
 * How long one session check is trusted before an event checks again. Short enough that a session
 * ended in another process (or by its expiry) stops working within seconds; long enough that a
 * burst of chat events costs one query, not one per message.
 */
export const SESSION_RECHECK_MS = 5_000;
/** How often every open socket is re-checked even when it sends nothing (it still receives broadcasts). */
export const SESSION_SWEEP_MS = 30_000;

const SESSION_ENDED: Ack<never> = { status: 'ERROR', errors: { code: 'not_signed_in', message: 'Your session has ended. Please sign in again.' } };

interface SocketIdentity {
  userId: number;
  role: string;
  sessionId: string;
}

/** The sessions among `sockets` that still exist, belong to the same user, and whose account is active with the same role. */
async function validSessions(sockets: SocketIdentity[]): Promise<Set<string>> {
  if (sockets.length === 0) return new Set();
  const sids = [...new Set(sockets.map((s) => s.sessionId))];
  const userIds = [...new Set(sockets.map((s) => s.userId))];
  const [sessions, users] = await Promise.all([
    Session.findAll({ where: { sid: { [Op.in]: sids }, expires: { [Op.gt]: new Date() } }, attributes: ['sid', 'userId'] }),
    User.findAll({ where: { id: { [Op.in]: userIds } }, attributes: ['id', 'status', 'role'] }),
  ]);
  const owner = new Map(sessions.map((s) => [s.sid, s.userId]));
  const account = new Map(users.map((u) => [u.id, u]));
  const valid = new Set<string>();
  for (const s of sockets) {
    const user = account.get(s.userId);
    // A role change ends the sessions too (admin service), but checking it here also covers other processes.
    if (owner.get(s.sessionId) === s.userId && user?.status === 'active' && user.role === s.role) valid.add(s.sessionId);
  }
  return valid;
}

/**
 * Every incoming event first re-checks the socket's session (at most every SESSION_RECHECK_MS). A
 * socket whose session has ended gets a typed `not_signed_in` ERROR ack and is disconnected, so a
 * sign-out elsewhere, an expired session or a switched-off account stops it sending at once.
 */
export function guardEvents(socket: AppSocket, logger: AppContext['logger']): void {
  // Checks run one after another, so events still reach their handlers in the order they came.
  let queue: Promise<void> = Promise.resolve();
  let waiting = 0;
  socket.use((packet, next) => {
    if (waiting === 0 && Date.now() - socket.data.sessionCheckedAt < SESSION_RECHECK_MS) return next();
    waiting += 1;
    queue = queue.then(async () => {
      try {
        if (socket.disconnected) return;
        if (Date.now() - socket.data.sessionCheckedAt >= SESSION_RECHECK_MS) {
          if (!(await validSessions([socket.data])).has(socket.data.sessionId)) {
            const ack = packet[packet.length - 1];
            if (typeof ack === 'function') (ack as (result: Ack<never>) => void)(SESSION_ENDED);
            socket.disconnect(true);
            return;
          }
          socket.data.sessionCheckedAt = Date.now();
        }
        next();
      } catch (error) {
        // A database hiccup must not sign anyone out; the event runs and its own queries decide.
        logger.error({ err: error }, 'socket session check failed');
        next();
      } finally {
        waiting -= 1;
      }
    });
  });
}

/**
 * One pass over this process's sockets: disconnect those whose session has ended, and take sockets
 * out of consultation rooms their user may no longer open (a consultation closed, a physio's
 * access withdrawn), so they stop receiving that room's broadcasts even if they never send again.
 */
export async function sweepSockets(io: AppServer): Promise<void> {
  const sockets = await io.local.fetchSockets();
  const valid = await validSessions(sockets.map((s) => s.data));
  const allowed = new Map<string, Promise<boolean>>();
  const mayStay = (userId: number, role: string, consultationId: number) => {
    const key = `${userId}:${consultationId}`;
    if (!allowed.has(key)) allowed.set(key, chatMembership({ id: userId, role }, consultationId).then(() => true, () => false));
    return allowed.get(key)!;
  };
  const emptied = new Set<number>();
  for (const socket of sockets) {
    if (!valid.has(socket.data.sessionId)) {
      socket.disconnect(true);
      continue;
    }
    socket.data.sessionCheckedAt = Date.now();
    for (const room of socket.rooms) {
      if (!room.startsWith('consultation:')) continue;
      const consultationId = Number(room.slice('consultation:'.length));
      if (await mayStay(socket.data.userId, socket.data.role, consultationId)) continue;
      socket.leave(consultationRoom(consultationId));
      emptied.add(consultationId);
    }
  }
  for (const consultationId of emptied) await announcePresence(io, consultationId);
}

/** Run `sweepSockets` every SESSION_SWEEP_MS until the app closes. */
export function startSocketSweep(io: AppServer, ctx: AppContext): void {
  let running = false;
  const timer = setInterval(() => {
    if (running) return;
    running = true;
    sweepSockets(io)
      .catch((error: unknown) => ctx.logger.error({ err: error }, 'socket sweep failed'))
      .finally(() => (running = false));
  }, SESSION_SWEEP_MS);
  timer.unref();
  ctx.onClose(() => clearInterval(timer));
}
