import { typingSchema } from '@shared/chat';
import { consultationRoom } from '../rooms';
import type { HandlerDeps } from '../types';

/** A typing indicator turns itself off after this long without a fresh signal. */
export const TYPING_TIMEOUT_MS = 6000;

/** Typing on/off for a joined room; the server switches it off if the client goes quiet. */
export function typingSet({ socket }: HandlerDeps) {
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
  return (payload: unknown) => {
    const parsed = typingSchema.safeParse(payload);
    if (!parsed.success || !socket.rooms.has(consultationRoom(parsed.data.consultationId))) return;
    const { consultationId, typing } = parsed.data;
    clearTimeout(timers.get(consultationId));
    timers.delete(consultationId);
    broadcast(consultationId, typing);
    if (typing) {
      timers.set(consultationId, setTimeout(() => {
        timers.delete(consultationId);
        broadcast(consultationId, false);
      }, TYPING_TIMEOUT_MS));
    }
  };
}
