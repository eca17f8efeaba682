import { z } from 'zod';
import { withAck } from '../ack';
import { consultationRoom } from '../rooms';
import { announcePresence } from '../presence';
import type { HandlerDeps } from '../types';

const leaveSchema = z.strictObject({ consultationId: z.number().int().positive() });

export function roomLeave({ io, socket, ctx }: HandlerDeps) {
  return withAck(ctx.logger, leaveSchema, async ({ consultationId }) => {
    await socket.leave(consultationRoom(consultationId));
    await announcePresence(io, consultationId);
    return null;
  });
}
