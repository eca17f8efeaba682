import { z } from 'zod';

/**
 * Everything the server reads from its environment, parsed once at start-up.
 * The start and test scripts fill these in for the embedded MariaDB and fakes; in production
 * the operator sets them to a managed MariaDB, a real SMTP relay and real Stripe keys.
 */
const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  PORT: z.coerce.number().int().min(0).max(65535).default(4780),
  HOST: z.string().default('127.0.0.1'),
  /** Base URL used in e-mail links, e.g. https://fit.example.com */
  PUBLIC_URL: z.string().url().optional(),
  DATABASE_URL: z.string().regex(/^mariadb:\/\//, 'DATABASE_URL must start with mariadb://'),
  DATABASE_POOL_MAX: z.coerce.number().int().min(1).max(200).default(10),
  SESSION_SECRET: z.string().min(32, 'SESSION_SECRET must be at least 32 characters'),
  /** Hours a signed-in session lasts without activity. */
  SESSION_TTL_HOURS: z.coerce.number().positive().max(24 * 90).default(24 * 14),
  /** Set when the app sits behind a TLS-terminating proxy (Secure cookies need it). */
  TRUST_PROXY: z.string().optional(),
  BCRYPT_COST: z.coerce.number().int().min(10).max(15).default(12),
  SMTP_URL: z.string().regex(/^smtps?:\/\//, 'SMTP_URL must start with smtp:// or smtps://').optional(),
  MAIL_FROM: z.string().default('Saddlestep <no-reply@saddlestep.test>'),
  MAIL_INBOX_URL: z.string().url().optional(),
  STRIPE_SECRET_KEY: z.string().optional(),
  /** Only for the local Stripe fake: http://127.0.0.1:PORT */
  STRIPE_API_BASE: z.string().url().optional(),
  STRIPE_WEBHOOK_SECRET: z.string().optional(),
  /**
   * Stripe's publishable key (pk_live_… or pk_test_…). With it the checkout shows Stripe's own card
   * field; without it development shows the test-card chooser and production cannot take cards.
   */
  STRIPE_PUBLISHABLE_KEY: z.string().regex(/^pk_(test|live)_\w+$/, 'STRIPE_PUBLISHABLE_KEY must start with pk_test_ or pk_live_').optional(),
  /** Folder for uploaded files; never inside the web root. */
  UPLOAD_DIR: z.string().default('.data/uploads'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  /** Sign-in and registration attempts allowed per client per window. */
  AUTH_RATE_LIMIT: z.coerce.number().int().min(1).default(20),
  AUTH_RATE_WINDOW_SECONDS: z.coerce.number().int().min(1).default(15 * 60),
  /** How often the in-process scheduler looks for due jobs; 0 switches it off in this process. */
  SCHEDULER_INTERVAL_SECONDS: z.coerce.number().int().min(0).max(3600).default(15),
  /** Chat sends allowed at once per user, and the refill rate per second (token bucket). */
  CHAT_BURST: z.coerce.number().int().min(1).max(100_000).default(20),
  CHAT_PER_SECOND: z.coerce.number().min(0.1).max(100_000).default(2),
  /** Where the built client lives; empty disables static serving (API-only tests). */
  CLIENT_DIST: z.string().default('dist'),
})
  .superRefine((env, issues) => {
    const publishable = env.STRIPE_PUBLISHABLE_KEY;
    if (!publishable) return;
    // A card tokenised with one Stripe account (or mode) cannot be charged by another.
    if (!env.STRIPE_SECRET_KEY) {
      issues.addIssue({ code: 'custom', path: ['STRIPE_PUBLISHABLE_KEY'], message: 'set STRIPE_SECRET_KEY too; the card field needs the server to charge the card' });
    } else if (publishable.startsWith('pk_live_') !== /^[sr]k_live_/.test(env.STRIPE_SECRET_KEY)) {
      issues.addIssue({ code: 'custom', path: ['STRIPE_PUBLISHABLE_KEY'], message: 'the publishable and secret keys must both be live keys or both be test keys' });
    }
  });

export type Config = z.infer<typeof envSchema>;

export class ConfigError extends Error {}

export function loadConfig(env: Record<string, string | undefined> = process.env): Config {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((issue) => `  ${issue.path.join('.')}: ${issue.message}`);
    throw new ConfigError(`Saddlestep cannot start; fix these settings:\n${lines.join('\n')}`);
  }
  return parsed.data;
}
