import path from 'node:path';
import { startPrivateMariaDb, ensureAppDatabase, type PrivateMariaDb } from './mariadb';
import { startMailCatcher, startStripeFake, type MailCatcher, type StripeFake } from './fakes';
import { loadLocalSecrets } from './secrets';

export interface LocalPorts {
  database: number;
  smtp: number;
  mailWeb: number;
  stripe: number;
}

export interface LocalServices {
  /** Environment for the app: only the settings the operator did not give are filled in. */
  env: Record<string, string>;
  mariadb: PrivateMariaDb | null;
  mail: MailCatcher | null;
  stripe: StripeFake | null;
  stop: () => Promise<void>;
}

/**
 * Start what the operator did not configure: a private MariaDB unless DATABASE_URL is set,
 * maildev unless SMTP_URL is set, the Stripe fake unless STRIPE_SECRET_KEY is set.
 * Everything listens on 127.0.0.1 only and keeps its files under `dataDir`.
 */
export async function startLocalServices(options: {
  dataDir: string;
  ports: LocalPorts;
  databaseName: string;
  given: Record<string, string | undefined>;
  log: (line: string) => void;
}): Promise<LocalServices> {
  const { dataDir, ports, databaseName, given, log } = options;
  if (given.STRIPE_PUBLISHABLE_KEY && !given.STRIPE_SECRET_KEY) {
    // Stripe's real card field makes tokens the local Stripe fake has never heard of.
    throw new Error('STRIPE_PUBLISHABLE_KEY is set without STRIPE_SECRET_KEY: set both (from the same Stripe account), or neither to use the local Stripe fake and its test cards.');
  }
  const secrets = loadLocalSecrets(dataDir);
  const env: Record<string, string> = {};
  const started: { stop: () => Promise<void> }[] = [];
  let mariadb: PrivateMariaDb | null = null;
  let mail: MailCatcher | null = null;
  let stripe: StripeFake | null = null;

  const stopAll = async () => {
    for (const service of started.reverse()) await service.stop().catch(() => undefined);
  };

  try {
    env.SESSION_SECRET = given.SESSION_SECRET ?? secrets.sessionSecret;
    if (!given.DATABASE_URL) {
      mariadb = await startPrivateMariaDb(path.join(dataDir, 'mariadb'), ports.database, log);
      // Adopted from a crashed run or started now: either way this run owns it and stops it.
      started.push(mariadb);
      env.DATABASE_URL = await ensureAppDatabase(mariadb.rootUrl, databaseName, 'saddlestep', secrets.databasePassword);
    }
    if (!given.SMTP_URL) {
      mail = await startMailCatcher({ smtpPort: ports.smtp, webPort: ports.mailWeb, mailDirectory: path.join(dataDir, 'mail') });
      started.push(mail);
      env.SMTP_URL = mail.smtpUrl;
      env.MAIL_INBOX_URL = mail.inboxUrl;
    }
    if (!given.STRIPE_SECRET_KEY) {
      stripe = await startStripeFake({ port: ports.stripe });
      started.push(stripe);
      env.STRIPE_SECRET_KEY = 'sk_test_saddlestep_local';
      env.STRIPE_API_BASE = stripe.apiBase;
      env.STRIPE_WEBHOOK_SECRET = given.STRIPE_WEBHOOK_SECRET ?? secrets.stripeWebhookSecret;
    }
  } catch (error) {
    await stopAll();
    throw error;
  }
  return { env, mariadb, mail, stripe, stop: stopAll };
}
