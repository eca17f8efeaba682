import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { randomUUID } from 'node:crypto';
import { currentConsent } from '@shared/rider';
import type { Ack } from '@shared/http';
import type { SaddlestepApp } from '@server/app';
import { Consultation, Intake } from '@server/models';
import { startTestApp } from '../support/app';
import { signedInAs } from '../support/factories';
import { caseOnStepOne, checkInBody } from '../support/care-factories';
import { ask, listenOnFreePort } from '../support/sockets';
import { socketFor } from '../support/chat-factories';

/**
 * Every health-data route and socket event, for every relation a user can have to the case:
 * the owner, the assigned fitter, the referred physio (accepted, consented), an unrelated rider,
 * fitter and physio, and an admin. Each cell states the exact status, and no answer other than
 * a 2xx may carry any of the case's data.
 */
type Who = 'owner' | 'assigned' | 'referred' | 'riderX' | 'fitterX' | 'physioX' | 'admin';
const WHO: Who[] = ['owner', 'assigned', 'referred', 'riderX', 'fitterX', 'physioX', 'admin'];
const MARKER = `marker-${randomUUID().slice(0, 8)}`;

let saddlestep: SaddlestepApp;
let baseUrl: string;
const clients = {} as Record<Who, Awaited<ReturnType<typeof signedInAs>>>;
const ids = { consultation: 0, plan: 0, intake: 0, sharedUpload: 0, privateUpload: 0, referral: 0, checkIn: 0 };

beforeAll(async () => {
  saddlestep = await startTestApp();
  baseUrl = await listenOnFreePort(saddlestep);
  const c = await caseOnStepOne(saddlestep.app);
  Object.assign(clients, { owner: c.rider, assigned: c.fitter, referred: c.physio });
  clients.riderX = await signedInAs(saddlestep.app, 'rider');
  clients.fitterX = await signedInAs(saddlestep.app, 'fitter');
  clients.physioX = await signedInAs(saddlestep.app, 'physio');
  clients.admin = await signedInAs(saddlestep.app, 'admin');
  ids.consultation = c.consultation.id;
  ids.plan = c.planId;
  const intake = (await Intake.findOne({ where: { riderId: c.rider.user.id, status: 'submitted' } }))!;
  await intake.update({ goalNotes: MARKER });
  ids.intake = intake.id;
  const png = await sharp({ create: { width: 20, height: 20, channels: 3, background: '#123' } }).png().toBuffer();
  for (const key of ['sharedUpload', 'privateUpload'] as const) {
    const res = await c.rider.agent.post('/api/rider/uploads').set('X-CSRF-Token', c.rider.csrfToken).field('view', 'front').attach('file', png, 'p.png');
    ids[key] = res.body.upload.id;
  }
  ids.checkIn = (await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody({ note: MARKER })).expect(201)).body.checkIn.id;
  await c.fitter.post(`/api/consultations/${c.consultation.id}/notes`, { body: MARKER }).expect(201);
  const referral = await c.fitter.post(`/api/consultations/${c.consultation.id}/referrals`, { urgency: 'routine', reason: MARKER, attachmentIds: [ids.sharedUpload], physioId: c.physio.user.id }).expect(201);
  ids.referral = referral.body.referral.id;
  await c.rider.post(`/api/rider/referrals/${ids.referral}/consent`, { version: currentConsent('share-with-physio')!.version, agreed: true }).expect(200);
  await c.physio.post(`/api/physio/referrals/${ids.referral}/accept`).expect(200);
});
afterAll(async () => {
  await saddlestep.close();
});

const routes: { path: () => string; expect: Record<Who, number> }[] = [
  { path: () => `/api/intakes/${ids.intake}`, expect: { owner: 200, assigned: 200, referred: 200, riderX: 404, fitterX: 404, physioX: 404, admin: 403 } },
  { path: () => `/api/uploads/${ids.sharedUpload}/file`, expect: { owner: 200, assigned: 200, referred: 200, riderX: 404, fitterX: 404, physioX: 404, admin: 403 } },
  { path: () => `/api/uploads/${ids.privateUpload}/thumbnail`, expect: { owner: 200, assigned: 200, referred: 404, riderX: 404, fitterX: 404, physioX: 404, admin: 403 } },
  { path: () => `/api/consultations/${ids.consultation}`, expect: { owner: 200, assigned: 200, referred: 200, riderX: 404, fitterX: 404, physioX: 404, admin: 403 } },
  { path: () => `/api/consultations/${ids.consultation}/case`, expect: { owner: 403, assigned: 200, referred: 403, riderX: 403, fitterX: 404, physioX: 403, admin: 403 } },
  { path: () => `/api/consultations/${ids.consultation}/notes`, expect: { owner: 403, assigned: 200, referred: 403, riderX: 403, fitterX: 404, physioX: 403, admin: 403 } },
  { path: () => `/api/consultations/${ids.consultation}/check-ins`, expect: { owner: 403, assigned: 200, referred: 200, riderX: 403, fitterX: 404, physioX: 404, admin: 403 } },
  { path: () => `/api/consultations/${ids.consultation}/plans`, expect: { owner: 200, assigned: 200, referred: 403, riderX: 404, fitterX: 404, physioX: 403, admin: 403 } },
  { path: () => `/api/consultations/${ids.consultation}/referrals`, expect: { owner: 200, assigned: 200, referred: 403, riderX: 404, fitterX: 404, physioX: 403, admin: 403 } },
  { path: () => `/api/plans/${ids.plan}`, expect: { owner: 200, assigned: 200, referred: 403, riderX: 404, fitterX: 404, physioX: 403, admin: 403 } },
  { path: () => `/api/physio/referrals/${ids.referral}/case`, expect: { owner: 403, assigned: 403, referred: 200, riderX: 403, fitterX: 403, physioX: 404, admin: 403 } },
  { path: () => `/api/uploads/${ids.sharedUpload}/measurements?consultationId=${ids.consultation}`, expect: { owner: 403, assigned: 200, referred: 403, riderX: 403, fitterX: 404, physioX: 403, admin: 403 } },
];

describe('health-data routes, by relation to the case', () => {
  for (const route of routes) {
    for (const who of WHO) {
      it(`${route.path().replace(/\d+/g, ':id')} as ${who} → ${route.expect[who]}`, async () => {
        const res = await clients[who].get(route.path());
        expect(res.status).toBe(route.expect[who]);
        if (res.status >= 300) {
          expect(JSON.stringify(res.body)).not.toContain(MARKER);
          expect(JSON.stringify(res.body)).not.toMatch(/knee|symptom|SqlError|sequelize/i);
        }
      });
    }
  }

  it('the owner’s own-data routes answer only with the owner’s data', async () => {
    for (const path of ['/api/rider/intake', '/api/rider/check-ins', '/api/rider/plans/current', '/api/rider/referrals']) {
      expect(JSON.stringify((await clients.riderX.get(path).expect(200)).body)).not.toContain(MARKER);
      await clients.assigned.get(path).expect(403);
    }
  });
});

describe('socket events, by relation to the case', () => {
  const allowed: Record<Who, boolean> = { owner: true, assigned: true, referred: true, riderX: false, fitterX: false, physioX: false, admin: false };
  for (const who of WHO) {
    it(`${who} ${allowed[who] ? 'may' : 'may not'} join, read or write the thread`, async () => {
      const socket = await socketFor(baseUrl, clients[who]);
      try {
        const consultationId = ids.consultation;
        const results = [
          await ask<Ack<unknown>>(socket, 'room:join', { consultationId, afterSeq: 0 }),
          await ask<Ack<unknown>>(socket, 'message:history', { consultationId, beforeSeq: 1000, limit: 10 }),
          await ask<Ack<unknown>>(socket, 'message:send', { consultationId, clientId: randomUUID(), body: `hello from ${who}` }),
          await ask<Ack<unknown>>(socket, 'message:delivered', { consultationId, seq: 1 }),
          await ask<Ack<unknown>>(socket, 'message:read', { consultationId, seq: 1 }),
        ];
        for (const ack of results) {
          expect(ack.status).toBe(allowed[who] ? 'OK' : 'ERROR');
          if (ack.status === 'ERROR') {
            expect(ack.errors.code).toBe('not_found');
            expect(JSON.stringify(ack)).not.toContain(MARKER);
          }
        }
      } finally {
        socket.close();
      }
    });
  }
});

describe('a referral opens only the consultation it was made on', () => {
  it('the referred physio cannot join or read the same rider’s consultation with another fitter', async () => {
    const other = await Consultation.create({
      riderId: clients.owner.user.id,
      fitterId: clients.fitterX.user.id,
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
    await clients.referred.get(`/api/consultations/${other.id}`).expect(404);
    const socket = await socketFor(baseUrl, clients.referred);
    try {
      const ack = await ask<Ack<unknown>>(socket, 'room:join', { consultationId: other.id, afterSeq: 0 });
      expect(ack.status).toBe('ERROR');
      const own = await ask<Ack<unknown>>(socket, 'room:join', { consultationId: ids.consultation, afterSeq: 0 });
      expect(own.status).toBe('OK');
    } finally {
      socket.close();
    }
  });
});
