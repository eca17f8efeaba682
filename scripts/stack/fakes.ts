import type { Server } from 'node:http';
import { createRequire } from 'node:module';
import fs from 'node:fs';
import { MailDev } from 'maildev';
import { waitFor } from './net';

const require = createRequire(import.meta.url);

export interface MailCatcher {
  smtpUrl: string;
  inboxUrl: string;
  stop: () => Promise<void>;
}

/** maildev on loopback: SMTP for nodemailer, a web inbox and `GET /api/email` for tests. */
export async function startMailCatcher({ smtpPort, webPort, mailDirectory }: { smtpPort: number; webPort: number; mailDirectory: string }): Promise<MailCatcher> {
  fs.mkdirSync(mailDirectory, { recursive: true });
  const maildev = new MailDev({ smtp: smtpPort, web: webPort, ip: '127.0.0.1', webIp: '127.0.0.1', mailDirectory, silent: true });
  await maildev.start();
  const inboxUrl = `http://127.0.0.1:${webPort}`;
  await waitFor(async () => (await fetch(`${inboxUrl}/api/healthz`).catch(() => null))?.ok === true, { timeoutMs: 15_000, what: 'maildev' });
  return { smtpUrl: `smtp://127.0.0.1:${smtpPort}`, inboxUrl, stop: () => maildev.stop() };
}

export interface StripeFake {
  apiBase: string;
  stop: () => Promise<void>;
}

/** stripe-stateful-mock in this process; the official SDK is pointed at it by STRIPE_API_BASE. */
export async function startStripeFake({ port }: { port: number }): Promise<StripeFake> {
  // The package logs every request through loglevel; keep the console for our own lines.
  const loglevel = require('loglevel') as { setLevel: (level: string) => void };
  loglevel.setLevel('warn');
  const { createExpressApp } = require('stripe-stateful-mock') as { createExpressApp: () => { listen: (port: number, host: string, cb: () => void) => Server } };
  const app = createExpressApp();
  const server = await new Promise<Server>((resolve) => {
    const s = app.listen(port, '127.0.0.1', () => resolve(s));
  });
  return {
    apiBase: `http://127.0.0.1:${port}`,
    stop: () => new Promise<void>((resolve) => { server.closeAllConnections?.(); server.close(() => resolve()); }),
  };
}
