/**
 * `npm run bench:chat` — chat throughput and delivery latency of the real server (session sign-in,
 * validation, MariaDB write before ack, ordered broadcast) against a bare socket.io echo server
 * measured in the same run. Usage: npm run bench:chat -- [rooms=20] [messagesPerRoom=50]
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import type { Socket } from 'socket.io-client';
import { startLocalServices } from '../stack/services';
import { freePort } from '../stack/net';
import { openClient, runLoad, type LoadResult } from './chat-load';
import { startEchoServer } from './echo-baseline';

const rooms = Number(process.argv[2] ?? 20);
const perRoom = Number(process.argv[3] ?? 50);
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'saddlestep-bench-'));
const log = (line: string) => console.log(`[bench] ${line}`);

const ask = (socket: Socket, event: string, payload: unknown) => socket.timeout(10_000).emitWithAck(event, payload) as Promise<{ status: string }>;

async function main() {
  const ports = { database: await freePort(), smtp: await freePort(), mailWeb: await freePort(), stripe: await freePort() };
  const services = await startLocalServices({ dataDir: tmp, ports, databaseName: 'saddlestep_bench', given: {}, log: () => {} });
  const port = await freePort();
  Object.assign(process.env, services.env, {
    NODE_ENV: 'test', LOG_LEVEL: 'silent', BCRYPT_COST: '10', PORT: String(port), CLIENT_DIST: '', UPLOAD_DIR: path.join(tmp, 'uploads'),
    AUTH_RATE_LIMIT: '100000', CHAT_BURST: '100000', CHAT_PER_SECOND: '100000', SCHEDULER_INTERVAL_SECONDS: '0',
  });
  const { loadConfig } = await import('../../server/config');
  const { startServer } = await import('../../server/index');
  const { Consultation, User } = await import('../../server/models');
  const { createPasswordHasher } = await import('../../server/services/passwords');
  const server = await startServer(loadConfig());
  const url = `http://127.0.0.1:${port}`;
  try {
    const hash = await createPasswordHasher(10).hash('bench-password-1');
    const signIn = async (email: string) => {
      const csrf = await fetch(`${url}/api/auth/csrf`);
      const cookie = csrf.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
      const { csrfToken } = (await csrf.json()) as { csrfToken: string };
      const res = await fetch(`${url}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json', 'x-csrf-token': csrfToken, cookie }, body: JSON.stringify({ email, password: 'bench-password-1' }) });
      return res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
    };
    log(`Setting up ${rooms} rooms with a rider and a fitter each…`);
    const appPairs: { sender: Socket; receiver: Socket; roomId: number }[] = [];
    for (let i = 0; i < rooms; i += 1) {
      const make = (role: 'rider' | 'fitter') => User.create({ email: `${role}-${i}-${randomUUID().slice(0, 6)}@bench.example`, passwordHash: hash, role, displayName: `${role} ${i}`, timeZone: 'UTC', status: 'active' });
      const [rider, fitter] = [await make('rider'), await make('fitter')];
      const starts = new Date(Date.now() + 86_400_000);
      const consultation = await Consultation.create({ riderId: rider.id, fitterId: fitter.id, intakeId: null, status: 'booked', startsAt: starts, endsAt: new Date(starts.getTime() + 3_600_000), holdExpiresAt: null, feeMinor: 0, currency: 'EUR', calendarUid: randomUUID(), cancelledById: null, cancelReason: null });
      const sender = await openClient(url, await signIn(rider.email));
      const receiver = await openClient(url, await signIn(fitter.email));
      await ask(sender, 'room:join', { consultationId: consultation.id });
      await ask(receiver, 'room:join', { consultationId: consultation.id });
      appPairs.push({ sender, receiver, roomId: consultation.id });
    }
    const echo = await startEchoServer();
    const echoPairs: typeof appPairs = [];
    for (let i = 0; i < rooms; i += 1) {
      const [sender, receiver] = [await openClient(echo.url), await openClient(echo.url)];
      await ask(sender, 'room:join', { consultationId: i });
      await ask(receiver, 'room:join', { consultationId: i });
      echoPairs.push({ sender, receiver, roomId: i });
    }
    const send = async (socket: Socket, consultationId: number, clientId: string, body: string) => {
      const ack = await ask(socket, 'message:send', { consultationId, clientId, body });
      if (ack.status !== 'OK') throw new Error(`send failed: ${JSON.stringify(ack)}`);
    };
    // Warm up both paths (JIT, connection pools) before measuring.
    await runLoad('warm-up', echoPairs.slice(0, 2), 5, send);
    await runLoad('warm-up', appPairs.slice(0, 2), 5, send);
    const baseline = await runLoad('bare socket.io echo', echoPairs, perRoom, send);
    const app = await runLoad('Saddlestep chat (MariaDB)', appPairs, perRoom, send);
    report([baseline, app], baseline);
    for (const p of [...appPairs, ...echoPairs]) [p.sender, p.receiver].forEach((s) => s.close());
    await echo.close();
  } finally {
    await server.close();
    await services.stop();
    fs.rmSync(tmp, { recursive: true, force: true });
  }
}

function report(results: LoadResult[], baseline: LoadResult) {
  console.log(`\nChat benchmark: ${rooms} rooms × ${perRoom} messages, ${os.cpus().length} CPU(s) ${os.cpus()[0]?.model ?? ''}, Node ${process.version}`);
  console.log('| run | messages | msg/s | p50 ms | p99 ms | msg/s vs baseline |');
  console.log('|---|---|---|---|---|---|');
  for (const r of results) {
    console.log(`| ${r.label} | ${r.messages} | ${r.perSecond.toFixed(0)} | ${r.p50Ms.toFixed(1)} | ${r.p99Ms.toFixed(1)} | ${(r.perSecond / baseline.perSecond).toFixed(2)}× |`);
  }
}

main().then(
  () => process.exit(0),
  (error: unknown) => {
    // Loud on purpose: a failed or partial benchmark must never pass for a result.
    console.error('\n*** CHAT BENCHMARK FAILED: no valid figures ***');
    console.error(error);
    process.exit(1);
  },
);
