import { typingSchema } from '@shared/chat';
import { notFound } from '../../errors';
import { withAck } from '../ack';
import { consultationRoom } from '../rooms';
import type { HandlerDeps } from '../types';

/** A typing indicator turns itself off after this long without a fresh signal. */
export const TYPING_TIMEOUT_MS = 6000;

/**
 * Typing on/off for a joined room; the server switches it off if the client goes quiet. Acked like
 * every event (the browser may ignore the ack), so bad input is answered rather than dropped.
 */
export function typingSet({ socket, ctx }: HandlerDeps) {
  const timers = new Map<number, NodeJS.Timeout>();
  const broadcast = (consultationId: number, typing: boolean) =>
    socket.to(consultationRoom(consultationId)).emit('typing:changed', { consultationId, userId: socket.data.userId, typing });
  socket.on('disconnect', () => {
    for (const [consultationId, timer] of timers) {
      clearTimeout(timer);
      broadcast(consultationId, false);
    }
    timers.clear();
  });
  return withAck(ctx.logger, typingSchema, async ({ consultationId, typing }) => {
    if (!socket.rooms.has(consultationRoom(consultationId))) throw notFound('That consultation');
    clearTimeout(timers.get(consultationId));
    timers.delete(consultationId);
    broadcast(consultationId, typing);
    if (typing) {
      timers.set(consultationId, setTimeout(() => {
        timers.delete(consultationId);
        broadcast(consultationId, false);
      }, TYPING_TIMEOUT_MS));
    }
    return null;
  });
}
