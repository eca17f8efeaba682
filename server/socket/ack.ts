import type { z } from 'zod';
import type { Ack } from '@shared/http';
import { AppError } from '../errors';
import { fieldErrors } from '../middleware/validate';
import type { Logger } from '../logger';

type AckFn<T> = (result: Ack<T>) => void;

/**
 * Wrap a socket event handler: validate the payload with its shared schema, run the handler, and
 * answer with a typed OK or ERROR ack. Nothing thrown inside ever reaches socket.io, so a bad
 * payload cannot close the connection; a missing ack callback is tolerated.
 */
export function withAck<S extends z.ZodType, T>(logger: Logger, schema: S, run: (input: z.output<S>) => Promise<T>) {
  return async (payload: unknown, ack?: unknown) => {
    const reply: AckFn<T> = typeof ack === 'function' ? (ack as AckFn<T>) : () => {};
    const parsed = schema.safeParse(payload);
    if (!parsed.success) {
      const fields = fieldErrors(parsed.error);
      reply({ status: 'ERROR', errors: { code: 'validation_failed', message: Object.values(fields)[0] ?? 'The request is not valid.', fields } });
      return;
    }
    try {
      reply({ status: 'OK', data: await run(parsed.data) });
    } catch (error) {
      if (error instanceof AppError) {
        reply({ status: 'ERROR', errors: error.toBody().error });
        return;
      }
      logger.error({ err: error }, 'socket handler failed');
      reply({ status: 'ERROR', errors: { code: 'internal_error', message: 'Something went wrong on our side. Please try again.' } });
    }
  };
}
