/**
 * `npm test` after the pre-step: a throw-away MariaDB and fakes on free ports, the client
 * build, one real server for the browser tests, then every vitest project. Exits non-zero on
 * any failure and removes everything it made.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { spawn } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { startLocalServices } from './services';
import { buildClientIfStale } from './client-build';
import { freePort } from './net';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const log = (line: string) => console.log(`[saddlestep:test] ${line}`);
const vitestArgs = process.argv.slice(2);
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'saddlestep-test-'));
const started = Date.now();

let cleanup: (() => Promise<void>) | null = null;
const finish = async (code: number) => {
  await cleanup?.().catch((error: unknown) => console.error(error));
  fs.rmSync(tmp, { recursive: true, force: true });
  log(`Finished in ${((Date.now() - started) / 1000).toFixed(1)} s.`);
  process.exit(code);
};
process.once('SIGINT', () => void finish(130));
process.once('SIGTERM', () => void finish(143));

/** Run a project tool (lint, type check) and resolve with its exit code; output goes to the console. */
function runTool(label: string, bin: string, args: string[]): Promise<number> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, [path.join(root, 'node_modules', bin), ...args], { cwd: root, stdio: ['ignore', 'pipe', 'pipe'] });
    let output = '';
    child.stdout.on('data', (chunk) => (output += chunk));
    child.stderr.on('data', (chunk) => (output += chunk));
    child.on('exit', (code) => {
      log(`${label}: ${code === 0 ? 'passed' : 'FAILED'}`);
      if (code !== 0) console.log(output);
      resolve(code ?? 1);
    });
  });
}

try {
  // Lint (which guards shared/ against Node, DOM and framework imports) and type checks run
  // beside the set-up on a full run; a filtered run skips them.
  const staticChecks = vitestArgs.length === 0
    ? Promise.all([runTool('eslint', 'eslint/bin/eslint.js', ['.']), runTool('vue-tsc', 'vue-tsc/bin/vue-tsc.js', ['--noEmit', '-p', 'tsconfig.json'])])
    : Promise.resolve([0]);
  const ports = { database: await freePort(), smtp: await freePort(), mailWeb: await freePort(), stripe: await freePort() };
  // The operator's DATABASE_URL and keys are ignored on purpose: tests never touch real data.
  const services = await startLocalServices({ dataDir: tmp, ports, databaseName: 'saddlestep_test', given: {}, log });
  cleanup = services.stop;

  // Only the browser tests need the built client; a filtered run of other tests skips the build.
  const needsClient = vitestArgs.length === 0 || vitestArgs.some((arg) => arg.includes('browser'));
  if (needsClient) await buildClientIfStale(root, log);

  const testEnv: Record<string, string> = {
    ...services.env,
    NODE_ENV: 'test',
    // Quiet by default; SADDLESTEP_TEST_LOG_LEVEL=error shows what a 500 hid while chasing a flaky test.
    LOG_LEVEL: process.env.SADDLESTEP_TEST_LOG_LEVEL ?? 'silent',
    BCRYPT_COST: '10',
    // A dotted folder, as under npm start (.data/uploads), so serving files is tested the way it runs.
    UPLOAD_DIR: path.join(tmp, '.data', 'uploads'),
    CLIENT_DIST: path.join(root, 'dist'),
    AUTH_RATE_LIMIT: '10000',
    // Tests drive the scheduler with explicit ticks; a background one would race them for jobs.
    SCHEDULER_INTERVAL_SECONDS: '0',
  };
  const serverPort = await freePort();
  testEnv.PUBLIC_URL = `http://127.0.0.1:${serverPort}`;
  Object.assign(process.env, testEnv, { PORT: String(serverPort) });

  // One real server for the browser tests (API tests build their own app per file).
  const { loadConfig } = await import('../../server/config');
  const { startServer } = await import('../../server/index');
  const { seedDemo } = await import('../../server/seed/demo');
  const { createPasswordHasher } = await import('../../server/services/passwords');
  const config = loadConfig();
  const server = await startServer(config);
  await seedDemo(server.ctx, createPasswordHasher(config.BCRYPT_COST));
  const stopServices = cleanup;
  cleanup = async () => {
    await server.close();
    await stopServices();
  };
  log(`Test server on http://127.0.0.1:${server.port}; database saddlestep_test on port ${ports.database}.`);

  const vitestEnv = { ...process.env, ...testEnv, CLIENT_DIST: '', SADDLESTEP_TEST_URL: `http://127.0.0.1:${server.port}`, SADDLESTEP_TEST_TMP: tmp };
  const runVitest = (args: string[]) =>
    new Promise<number>((resolve) => {
      const child = spawn(process.execPath, [path.join(root, 'node_modules/vitest/vitest.mjs'), 'run', ...args], { cwd: root, stdio: 'inherit', env: vitestEnv });
      child.on('exit', (c, signal) => resolve(c ?? (signal ? 1 : 0)));
    });
  // A full run measures coverage of shared/ alone (the 95 % gate), then runs everything else
  // without the coverage overhead; a filtered run passes its arguments straight through.
  const code = vitestArgs.length > 0
    ? await runVitest(vitestArgs)
    : Math.max(await runVitest(['--project', 'shared', '--coverage']), await runVitest(['--project', 'server', '--project', 'browser']));
  const checks = await staticChecks;
  await finish(code !== 0 ? code : checks.some((c) => c !== 0) ? 1 : 0);
} catch (error) {
  console.error(`[saddlestep:test] Set-up failed: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`);
  await finish(1);
}
