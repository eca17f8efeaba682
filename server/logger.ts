import { pino, type Logger } from 'pino';
import type { Config } from './config';

export type { Logger };

/** JSON logs to stdout; secrets and cookies are redacted before they are written. */
export function createLogger(config: Pick<Config, 'LOG_LEVEL'>): Logger {
  return pino({
    level: config.LOG_LEVEL,
    redact: {
      paths: ['req.headers.cookie', 'req.headers.authorization', 'req.headers["x-csrf-token"]', 'res.headers["set-cookie"]', '*.password', '*.passwordHash'],
      censor: '[redacted]',
    },
  });
}
