import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import AdmZip from 'adm-zip';
import { randomUUID } from 'node:crypto';
import type { Ack } from '@shared/http';
import type { SaddlestepApp } from '@server/app';
import { Consultation } from '@server/models';
import { startTestApp } from '../support/app';
import { ask, listenOnFreePort } from '../support/sockets';
import { socketFor } from '../support/chat-factories';
import { buildMatrixCase, expectNoLeak, ROLE_OF, STATE_PHYSIOS, WHO, type MatrixCase, type Who } from '../support/matrix-case';

/**
 * Every health-data read and socket event, for every relation a user can have to the case (see
 * tests/support/matrix-case.ts). Each cell states the exact status, and every answer, 2xx or
 * not, is checked for anything that user may not see. Writes are in authorization-matrix-writes.
 */
let saddlestep: SaddlestepApp;
let baseUrl: string;
let m: MatrixCase;

beforeAll(async () => {
  saddlestep = await startTestApp();
  baseUrl = await listenOnFreePort(saddlestep);
  m = await buildMatrixCase(saddlestep.app);
});
afterAll(async () => {
  await saddlestep.close();
});

/** Binary answers (files, the export zip) are kept as bytes; JSON is parsed as usual. */
const raw = (response: import('superagent').Response, done: (err: Error | null, body: unknown) => void) => {
  const chunks: Buffer[] = [];
  response.on('data', (chunk: Buffer) => chunks.push(chunk));
  response.on('end', () => done(null, Buffer.concat(chunks)));
};
async function read(who: Who, path: string) {
  const res = await m.clients[who].agent.get(path).buffer(true).parse(raw);
  const bytes = res.body as Buffer;
  const text = bytes.toString('utf8');
  return { status: res.status, bytes, text, json: () => JSON.parse(text) as unknown };
}

type Cells = Record<Who, number>;
/** owner, assigned, referred, riderX, fitterX, physioX, admin; physios in the other referral states answer like physioX. */
function cells(owner: number, assigned: number, referred: number, riderX: number, fitterX: number, physioX: number, admin: number): Cells {
  return { owner, assigned, referred, riderX, fitterX, physioX, admin, awaiting: physioX, withdrawn: physioX, declined: physioX };
}
/** The case's ids; before the case exists (while tests are being named) each id reads `:id`. */
const ids = () => m?.ids ?? new Proxy({} as MatrixCase['ids'], { get: (_, key) => (key === 'own' ? {} : ':id') });
const routes: { path: (who: Who) => string; expect: Cells }[] = [
  { path: () => `/api/intakes/${ids().intake}`, expect: cells(200, 200, 200, 404, 404, 404, 403) },
  { path: () => `/api/uploads/${ids().sharedUpload}/file`, expect: cells(200, 200, 200, 404, 404, 404, 403) },
  { path: () => `/api/uploads/${ids().privateUpload}/thumbnail`, expect: cells(200, 200, 404, 404, 404, 404, 403) },
  { path: () => `/api/consultations/${ids().consultation}`, expect: cells(200, 200, 200, 404, 404, 404, 403) },
  { path: () => `/api/consultations/${ids().consultation}/case`, expect: cells(403, 200, 403, 403, 404, 403, 403) },
  { path: () => `/api/consultations/${ids().consultation}/plan-inputs?bikeId=${ids().bike}`, expect: cells(403, 200, 403, 403, 404, 403, 403) },
  { path: () => `/api/consultations/${ids().consultation}/notes`, expect: cells(403, 200, 403, 403, 404, 403, 403) },
  { path: () => `/api/consultations/${ids().consultation}/check-ins`, expect: cells(403, 200, 200, 403, 404, 404, 403) },
  { path: () => `/api/consultations/${ids().consultation}/plans`, expect: cells(200, 200, 403, 404, 404, 403, 403) },
  { path: () => `/api/consultations/${ids().consultation}/referrals`, expect: cells(200, 200, 403, 404, 404, 403, 403) },
  { path: () => `/api/plans/${ids().plan}`, expect: cells(200, 200, 403, 404, 404, 403, 403) },
  { path: () => `/api/physio/referrals/${ids().referral}/case`, expect: cells(403, 403, 200, 403, 403, 404, 403) },
  // Each physio asks for their own referral's case: withdrawn consent or no consent yet hides it; declined cannot open it.
  { path: (who) => `/api/physio/referrals/${ids().own[who] ?? ids().referral}/case`, expect: { ...cells(403, 403, 200, 403, 403, 404, 403), awaiting: 404, withdrawn: 404, declined: 409 } },
  { path: () => `/api/uploads/${ids().sharedUpload}/measurements?consultationId=${ids().consultation}`, expect: cells(403, 200, 403, 403, 404, 403, 403) },
];

describe('health-data routes, by relation to the case', () => {
  for (const route of routes) {
    for (const who of WHO) {
      it(`${route.path('owner')} as ${who} → ${route.expect[who]}`, async () => {
        const res = await read(who, route.path(who));
        expect(res.status).toBe(route.expect[who]);
        expectNoLeak(m, who, res.text);
        if (res.status >= 300) expect(res.text).not.toMatch(/knee|symptom|SqlError|sequelize/i);
      });
    }
  }

  it('lists to a referred physio only the photos shared on the referral', async () => {
    const body = (await read('referred', `/api/intakes/${ids().intake}`)).json() as { uploads: { id: number }[] };
    expect(body.uploads.map((u) => u.id)).toEqual([ids().sharedUpload]);
    const fitters = (await read('assigned', `/api/intakes/${ids().intake}`)).json() as { uploads: { id: number }[] };
    expect(fitters.uploads.map((u) => u.id).sort()).toEqual([ids().sharedUpload, ids().privateUpload].sort());
  });

  it('the owner’s own-data routes answer only with the owner’s data', async () => {
    for (const path of ['/api/rider/intake', '/api/rider/check-ins', '/api/rider/plans/current', '/api/rider/referrals']) {
      expect(JSON.stringify((await m.clients.riderX.get(path).expect(200)).body)).not.toContain(m.marker);
      await m.clients.assigned.get(path).expect(403);
    }
  });
});

/**
 * Routes that answer with the caller's own data: 200 for their role, 403 for every other role.
 * `shows` names who must find the case's data there (proving the leak check looks at real data).
 */
const ownData: { path: string; roles: string[]; shows?: Who[] }[] = [
  ...['/api/rider/home', '/api/rider/profile', '/api/rider/bikes', '/api/rider/booking-readiness', '/api/rider/uploads', '/api/rider/check-ins', '/api/rider/plans/current'].map((path) => ({ path, roles: ['rider'] })),
  { path: '/api/rider/intake', roles: ['rider'], shows: ['owner'] },
  { path: '/api/rider/consents', roles: ['rider'] },
  { path: '/api/rider/referrals', roles: ['rider'], shows: ['owner'] },
  { path: '/api/consultations', roles: ['rider', 'fitter'] },
  { path: '/api/fitter/follow-ups', roles: ['fitter'] },
  { path: '/api/fitter/settings', roles: ['fitter'] },
  { path: '/api/physio/referrals', roles: ['physio'], shows: ['referred'] },
  ...['/api/admin/home', '/api/admin/users', '/api/admin/accounts/pending', '/api/admin/payments', '/api/admin/refunds/attention', '/api/admin/settings', '/api/admin/audit?limit=200'].map((path) => ({ path, roles: ['admin'] })),
  { path: '/api/auth/me', roles: ['rider', 'fitter', 'physio', 'admin'] },
];

describe('own-data routes, for every role', () => {
  for (const route of ownData) {
    it(`${route.path} answers each role with its own data only`, async () => {
      for (const who of WHO) {
        const res = await read(who, route.path);
        expect(res.status, `${route.path} as ${who}`).toBe(route.roles.includes(ROLE_OF[who]) ? 200 : 403);
        expectNoLeak(m, who, res.text);
        if (route.shows?.includes(who)) expect(res.text).toContain(m.marker);
      }
    });
  }

  it('exports only the caller’s own data, and only to riders', async () => {
    for (const who of WHO) {
      const res = await read(who, '/api/rider/export');
      expect(res.status, who).toBe(ROLE_OF[who] === 'rider' ? 200 : 403);
      if (res.status !== 200) continue;
      const data = new AdmZip(res.bytes).readAsText('data.json');
      expectNoLeak(m, who, data);
      if (who === 'owner') expect(data).toContain(m.marker);
    }
  });
});

describe('socket events, by relation to the case', () => {
  const allowed = (who: Who) => ['owner', 'assigned', 'referred'].includes(who);
  for (const who of WHO) {
    it(`${who} ${allowed(who) ? 'may' : 'may not'} join, read, write or type in the thread`, async () => {
      const socket = await socketFor(baseUrl, m.clients[who]);
      const heard: string[] = [];
      socket.onAny((event: string, payload: unknown) => heard.push(`${event} ${JSON.stringify(payload)}`));
      try {
        const consultationId = ids().consultation;
        const results = [
          await ask<Ack<unknown>>(socket, 'room:join', { consultationId, afterSeq: 0 }),
          await ask<Ack<unknown>>(socket, 'message:history', { consultationId, beforeSeq: 1000, limit: 10 }),
          await ask<Ack<unknown>>(socket, 'message:send', { consultationId, clientId: randomUUID(), body: `hello from ${who}` }),
          await ask<Ack<unknown>>(socket, 'message:delivered', { consultationId, seq: 1 }),
          await ask<Ack<unknown>>(socket, 'message:read', { consultationId, seq: 1 }),
          await ask<Ack<unknown>>(socket, 'typing:set', { consultationId, typing: true }),
        ];
        for (const ack of results) {
          expect(ack.status).toBe(allowed(who) ? 'OK' : 'ERROR');
          if (ack.status === 'ERROR') expect(ack.errors.code).toBe('not_found');
          expectNoLeak(m, who, ack);
        }
        // Leaving a room one is not in changes nothing and says nothing, so it is OK for everyone.
        expect(await ask<Ack<unknown>>(socket, 'room:leave', { consultationId })).toEqual({ status: 'OK', data: null });
        await new Promise((r) => setTimeout(r, 100));
        if (!allowed(who)) expect(heard.filter((h) => h.includes(`"consultationId":${consultationId}`))).toEqual([]);
        expectNoLeak(m, who, heard.join('\n'));
      } finally {
        socket.close();
      }
    });
  }
});

describe('a referral opens only the consultation it was made on', () => {
  it('the referred physio cannot join or read the same rider’s consultation with another fitter', async () => {
    const other = await Consultation.create({
      riderId: m.clients.owner.user.id,
      fitterId: m.clients.fitterX.user.id,
      intakeId: null,
      status: 'booked',
      startsAt: new Date(Date.now() + 5 * 86_400_000),
      endsAt: new Date(Date.now() + 5 * 86_400_000 + 3_600_000),
      holdExpiresAt: null,
      feeMinor: 9000,
      currency: 'EUR',
      calendarUid: `${randomUUID()}@test`,
      cancelledById: null,
      cancelReason: null,
    });
    await m.clients.referred.get(`/api/consultations/${other.id}`).expect(404);
    for (const who of STATE_PHYSIOS) await m.clients[who].get(`/api/consultations/${other.id}`).expect(404);
    const socket = await socketFor(baseUrl, m.clients.referred);
    try {
      const ack = await ask<Ack<unknown>>(socket, 'room:join', { consultationId: other.id, afterSeq: 0 });
      expect(ack.status).toBe('ERROR');
      const own = await ask<Ack<unknown>>(socket, 'room:join', { consultationId: ids().consultation, afterSeq: 0 });
      expect(own.status).toBe('OK');
    } finally {
      socket.close();
    }
  });
});
