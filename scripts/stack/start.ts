/**
 * `npm start` after the pre-step: local services, migrations, demo seed, client build, one
 * server for app + API + socket.io. `--dev` serves the client through Vite with hot reload.
 */
import path from 'node:path';
import fs from 'node:fs';
import { fileURLToPath } from 'node:url';
import { startLocalServices } from './services';
import { acquireRunLock } from './run-lock';
import { buildClientIfStale } from './client-build';
import { isPortOpen } from './net';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const dataDir = path.join(root, '.data');
const devMode = process.argv.includes('--dev');
const log = (line: string) => console.log(`[saddlestep] ${line}`);

const port = Number(process.env.PORT ?? 4780);
const ports = {
  database: Number(process.env.SADDLESTEP_DB_PORT ?? 4706),
  smtp: Number(process.env.SADDLESTEP_SMTP_PORT ?? 4725),
  mailWeb: Number(process.env.SADDLESTEP_MAIL_WEB_PORT ?? 4708),
  stripe: Number(process.env.SADDLESTEP_STRIPE_PORT ?? 4712),
};
const devClientPort = Number(process.env.SADDLESTEP_DEV_PORT ?? 5173);
const appUrl = process.env.PUBLIC_URL ?? `http://127.0.0.1:${devMode ? devClientPort : port}`;

fs.mkdirSync(dataDir, { recursive: true });
const lock = acquireRunLock(path.join(dataDir, 'run.json'), { pid: process.pid, url: appUrl, startedAt: new Date().toISOString() });
if (!lock.ok) {
  log(`Saddlestep is already running from this folder at ${lock.holder.url} (pid ${lock.holder.pid}, since ${lock.holder.startedAt}).`);
  log('Use that one, or stop it with Ctrl-C in its terminal first.');
  process.exit(0);
}
if (await isPortOpen(port)) {
  lock.release();
  log(`Port ${port} is already in use by another program. Set PORT to a free port and try again.`);
  process.exit(1);
}

let shutdown: (() => Promise<void>) | null = null;
let stopping = false;
const stop = async (code: number) => {
  if (stopping) return;
  stopping = true;
  log('Stopping…');
  await shutdown?.().catch((error: unknown) => console.error(error));
  lock.release();
  log('Stopped.');
  process.exit(code);
};
process.once('SIGINT', () => void stop(0));
process.once('SIGTERM', () => void stop(0));
process.once('SIGHUP', () => void stop(0));

try {
  const services = await startLocalServices({ dataDir, ports, databaseName: 'saddlestep', given: process.env, log });
  shutdown = services.stop;
  Object.assign(process.env, services.env, {
    NODE_ENV: process.env.NODE_ENV ?? 'development',
    PORT: String(port),
    PUBLIC_URL: appUrl,
    UPLOAD_DIR: process.env.UPLOAD_DIR ?? path.join(dataDir, 'uploads'),
    LOG_LEVEL: process.env.LOG_LEVEL ?? 'warn',
    CLIENT_DIST: devMode ? '' : path.join(root, 'dist'),
  });

  if (!devMode) await buildClientIfStale(root, log);

  const { loadConfig } = await import('../../server/config');
  const { startServer } = await import('../../server/index');
  const { seedDemo } = await import('../../server/seed/demo');
  const { createPasswordHasher } = await import('../../server/services/passwords');
  const { DEMO_PASSWORD, DEMO_PEOPLE, DEMO_STUDIO_NAME } = await import('../../server/seed/demo-people');

  const config = loadConfig();
  const server = await startServer(config);
  const stopServices = shutdown;
  shutdown = async () => {
    await server.close();
    await stopServices();
  };
  const seeded = await seedDemo(server.ctx, createPasswordHasher(config.BCRYPT_COST));

  if (devMode) {
    const { createServer } = await import('vite');
    process.env.SADDLESTEP_API_PORT = String(port);
    const vite = await createServer({ root, configFile: path.join(root, 'vite.config.ts'), server: { port: devClientPort, host: '127.0.0.1', strictPort: true } });
    await vite.listen();
    const stopApp = shutdown;
    shutdown = async () => {
      await vite.close();
      await stopApp();
    };
  }

  const lines = [
    '',
    `Saddlestep is running: ${appUrl}`,
    devMode ? `  (hot reload; the API itself is on http://127.0.0.1:${port})` : '',
    services.mail ? `Mail inbox (maildev):  ${services.mail.inboxUrl}` : '',
    services.stripe ? `Stripe fake:           ${services.stripe.apiBase}` : '',
    services.mariadb ? `Private MariaDB:       127.0.0.1:${services.mariadb.port} (data in .data/mariadb)` : '',
    '',
    `Demo sign-ins at ${DEMO_STUDIO_NAME} (password for all: ${DEMO_PASSWORD})${seeded.created ? `; ${seeded.created} demo accounts created` : ''}:`,
    ...DEMO_PEOPLE.map((p) => `  ${p.role.padEnd(7)} ${p.email.padEnd(28)} ${p.displayName}`),
    '',
    'Press Ctrl-C to stop everything.',
  ];
  console.log(lines.filter((line, i) => line !== '' || lines[i - 1] !== '').join('\n'));
} catch (error) {
  console.error(`[saddlestep] Could not start: ${error instanceof Error ? error.message : String(error)}`);
  await stop(1);
}
