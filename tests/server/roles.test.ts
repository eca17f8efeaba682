import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { ROLES, type Role } from '@shared/auth';
import type { SaddlestepApp } from '@server/app';
import { browserLikeAgent, startTestApp } from '../support/app';
import { buildUser, signedInAs, TEST_PASSWORD } from '../support/factories';
import { waitForMails } from '../support/mail';

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/**
 * Every guarded route and the roles allowed on it. A route added to the router without a line
 * here is still guarded, but add it so this matrix keeps covering the whole API. An allowed role
 * may still get 400 or 404 (the sample ids and bodies are not real); it must never get 401 or 403.
 */
const GUARDED_ROUTES: { method: Method; path: string; roles: Role[]; body?: object }[] = [
  { method: 'get', path: '/api/rider/home', roles: ['rider'] },
  { method: 'patch', path: '/api/auth/me', roles: ['rider', 'fitter', 'physio', 'admin'], body: {} },
  { method: 'get', path: '/api/admin/home', roles: ['admin'] },
  { method: 'get', path: '/api/admin/accounts/pending', roles: ['admin'] },
  { method: 'post', path: '/api/admin/accounts/4294967295/decision', roles: ['admin'], body: { decision: 'approve' } },
  // Booking
  { method: 'get', path: '/api/fitters', roles: ['rider'] },
  { method: 'get', path: '/api/fitters/4294967295/slots?from=2030-01-01&to=2030-01-02', roles: ['rider', 'fitter'] },
  { method: 'get', path: '/api/fitter/settings', roles: ['fitter'] },
  { method: 'put', path: '/api/fitter/settings', roles: ['fitter'], body: {} },
  { method: 'get', path: '/api/payments/card-entry', roles: ['rider'] },
  { method: 'post', path: '/api/consultations', roles: ['rider'], body: {} },
  { method: 'get', path: '/api/consultations', roles: ['rider', 'fitter'] },
  { method: 'get', path: '/api/consultations/4294967295', roles: ['rider', 'fitter', 'physio'] },
  { method: 'get', path: '/api/consultations/4294967295/cancellation-terms', roles: ['rider', 'fitter'] },
  { method: 'post', path: '/api/consultations/4294967295/payment', roles: ['rider'], body: {} },
  { method: 'post', path: '/api/consultations/4294967295/reschedule', roles: ['rider', 'fitter'], body: {} },
  { method: 'post', path: '/api/consultations/4294967295/cancel', roles: ['rider', 'fitter', 'admin'], body: {} },
  { method: 'post', path: '/api/consultations/4294967295/no-show', roles: ['fitter'], body: {} },
  // Consultation room: case, plans, notes, measurements, follow-ups
  { method: 'post', path: '/api/consultations/4294967295/start', roles: ['fitter'] },
  { method: 'get', path: '/api/consultations/4294967295/case', roles: ['fitter'] },
  { method: 'get', path: '/api/consultations/4294967295/plan-inputs?bikeId=1', roles: ['fitter'] },
  { method: 'post', path: '/api/consultations/4294967295/plans', roles: ['fitter'], body: {} },
  { method: 'get', path: '/api/consultations/4294967295/plans', roles: ['rider', 'fitter'] },
  { method: 'get', path: '/api/consultations/4294967295/notes', roles: ['fitter'] },
  { method: 'post', path: '/api/consultations/4294967295/notes', roles: ['fitter'], body: {} },
  { method: 'post', path: '/api/uploads/4294967295/measurements', roles: ['fitter'], body: {} },
  { method: 'get', path: '/api/uploads/4294967295/measurements?consultationId=1', roles: ['fitter'] },
  { method: 'get', path: '/api/fitter/follow-ups', roles: ['fitter'] },
  { method: 'get', path: '/api/rider/plans/current', roles: ['rider'] },
  { method: 'get', path: '/api/plans/4294967295', roles: ['rider', 'fitter'] },
  { method: 'post', path: '/api/plans/4294967295/steps/1/apply', roles: ['rider'], body: {} },
  { method: 'post', path: '/api/rider/bikes/4294967295/revert', roles: ['rider'], body: {} },
  // Check-ins and referrals
  { method: 'post', path: '/api/plans/4294967295/steps/1/check-ins', roles: ['rider'], body: {} },
  { method: 'post', path: '/api/plans/4294967295/steps/1/revert', roles: ['rider'], body: {} },
  { method: 'get', path: '/api/rider/check-ins', roles: ['rider'] },
  { method: 'get', path: '/api/consultations/4294967295/check-ins', roles: ['fitter', 'physio'] },
  { method: 'post', path: '/api/check-ins/4294967295/review', roles: ['fitter'] },
  { method: 'get', path: '/api/physios', roles: ['fitter'] },
  { method: 'post', path: '/api/consultations/4294967295/referrals', roles: ['fitter'], body: {} },
  { method: 'get', path: '/api/consultations/4294967295/referrals', roles: ['rider', 'fitter'] },
  { method: 'post', path: '/api/referrals/4294967295/confirm', roles: ['fitter'], body: {} },
  { method: 'get', path: '/api/rider/referrals', roles: ['rider'] },
  { method: 'post', path: '/api/rider/referrals/4294967295/consent', roles: ['rider'], body: {} },
  { method: 'get', path: '/api/physio/referrals', roles: ['physio'] },
  { method: 'get', path: '/api/physio/referrals/4294967295/case', roles: ['physio'] },
  { method: 'post', path: '/api/physio/referrals/4294967295/receive', roles: ['physio'] },
  { method: 'post', path: '/api/physio/referrals/4294967295/accept', roles: ['physio'] },
  { method: 'post', path: '/api/physio/referrals/4294967295/start', roles: ['physio'] },
  { method: 'post', path: '/api/physio/referrals/4294967295/decline', roles: ['physio'], body: {} },
  { method: 'post', path: '/api/physio/referrals/4294967295/respond', roles: ['physio'], body: {} },
  { method: 'post', path: '/api/physio/referrals/4294967295/clear-hold', roles: ['physio'], body: {} },
  // Admin and privacy
  { method: 'get', path: '/api/admin/users', roles: ['admin'] },
  { method: 'patch', path: '/api/admin/users/4294967295', roles: ['admin'], body: { status: 'active' } },
  { method: 'get', path: '/api/admin/settings', roles: ['admin'] },
  { method: 'put', path: '/api/admin/settings', roles: ['admin'], body: {} },
  { method: 'get', path: '/api/admin/payments', roles: ['admin'] },
  { method: 'get', path: '/api/admin/refunds/attention', roles: ['admin'] },
  { method: 'post', path: '/api/admin/refunds/4294967295/retry', roles: ['admin'], body: {} },
  { method: 'post', path: '/api/admin/payments/4294967295/refund', roles: ['admin'], body: {} },
  { method: 'get', path: '/api/admin/audit', roles: ['admin'] },
  { method: 'delete', path: '/api/rider/account', roles: ['rider'] },
  // The rider's journey: profile, bikes, intake, consent, uploads; health-data readers answer 404 unless related.
  { method: 'get', path: '/api/rider/profile', roles: ['rider'] },
  { method: 'put', path: '/api/rider/profile', roles: ['rider'], body: {} },
  { method: 'put', path: '/api/rider/unit-preference', roles: ['rider'], body: {} },
  { method: 'get', path: '/api/rider/bikes', roles: ['rider'] },
  { method: 'post', path: '/api/rider/bikes', roles: ['rider'], body: {} },
  { method: 'get', path: '/api/rider/bikes/4294967295', roles: ['rider'] },
  { method: 'patch', path: '/api/rider/bikes/4294967295', roles: ['rider'], body: { name: 'x' } },
  { method: 'delete', path: '/api/rider/bikes/4294967295', roles: ['rider'] },
  { method: 'post', path: '/api/rider/bikes/4294967295/snapshots', roles: ['rider'], body: {} },
  { method: 'get', path: '/api/rider/intake', roles: ['rider'] },
  // Before the draft exists, so the rider gets 404 here rather than a 204.
  { method: 'delete', path: '/api/rider/intake/draft', roles: ['rider'] },
  { method: 'put', path: '/api/rider/intake/draft', roles: ['rider'], body: { goals: [] } },
  { method: 'post', path: '/api/rider/intake/submit', roles: ['rider'], body: {} },
  { method: 'get', path: '/api/rider/booking-readiness', roles: ['rider'] },
  { method: 'get', path: '/api/rider/consents', roles: ['rider'] },
  { method: 'post', path: '/api/rider/consents/4294967295/withdraw', roles: ['rider'] },
  { method: 'post', path: '/api/rider/uploads', roles: ['rider'], body: {} },
  { method: 'get', path: '/api/rider/uploads', roles: ['rider'] },
  { method: 'delete', path: '/api/rider/uploads/4294967295', roles: ['rider'] },
  { method: 'get', path: '/api/intakes/4294967295', roles: ['rider', 'fitter', 'physio'] },
  { method: 'get', path: '/api/uploads/4294967295/file', roles: ['rider', 'fitter', 'physio'] },
  { method: 'get', path: '/api/uploads/4294967295/thumbnail', roles: ['rider', 'fitter', 'physio'] },
];

function send(client: Awaited<ReturnType<typeof browserLikeAgent>>, route: (typeof GUARDED_ROUTES)[number]) {
  if (route.method === 'get') return client.get(route.path);
  if (route.method === 'delete') return client.delete(route.path);
  return client[route.method](route.path, route.body);
}

let saddlestep: SaddlestepApp;
const clients = {} as Record<Role, Awaited<ReturnType<typeof signedInAs>>>;

beforeAll(async () => {
  saddlestep = await startTestApp();
  for (const role of ROLES) clients[role] = await signedInAs(saddlestep.app, role);
});
afterAll(async () => {
  await saddlestep.close();
});

describe('role checks on every guarded route', () => {
  for (const route of GUARDED_ROUTES) {
    const label = `${route.method.toUpperCase()} ${route.path.split('?')[0]}`;
    for (const role of ROLES) {
      const allowed = route.roles.includes(role);
      it(`${label} as ${role} → ${allowed ? 'allowed' : '403'}`, async () => {
        const res = await send(clients[role], route);
        if (allowed) {
          expect([200, 201, 204, 400, 404, 409]).toContain(res.status);
        } else {
          expect(res.status).toBe(403);
          expect(res.body.error.code).toBe('forbidden');
        }
      });
    }
    it(`${label} signed out → 401`, async () => {
      const anonymous = await browserLikeAgent(saddlestep.app);
      expect((await send(anonymous, route)).status).toBe(401);
    });
  }
});

describe('admin approval of pending staff', () => {
  it('lets an approved fitter sign in, and a rejected physio not', async () => {
    const fitter = await buildUser({ role: 'fitter', status: 'pending' });
    const physio = await buildUser({ role: 'physio', status: 'pending' });
    const pending = await clients.admin.get('/api/admin/accounts/pending').expect(200);
    expect(pending.body.accounts.map((a: { id: number }) => a.id)).toEqual(expect.arrayContaining([fitter.id, physio.id]));

    await clients.admin.post(`/api/admin/accounts/${fitter.id}/decision`, { decision: 'approve' }).expect(200);
    await clients.admin.post(`/api/admin/accounts/${physio.id}/decision`, { decision: 'reject' }).expect(200);

    const fitterSignIn = await (await browserLikeAgent(saddlestep.app)).post('/api/auth/sign-in', { email: fitter.email, password: TEST_PASSWORD });
    expect(fitterSignIn.status).toBe(200);
    const physioSignIn = await (await browserLikeAgent(saddlestep.app)).post('/api/auth/sign-in', { email: physio.email, password: TEST_PASSWORD });
    expect(physioSignIn.status).toBe(403);
    // Both hear the outcome by e-mail, as the registration page promised.
    expect(await waitForMails(fitter.email, { subject: /account is ready/ })).toHaveLength(1);
    expect(await waitForMails(physio.email, { subject: /application/ })).toHaveLength(1);
  });

  it('refuses to decide an account that is not pending', async () => {
    const rider = await buildUser({ role: 'rider' });
    const res = await clients.admin.post(`/api/admin/accounts/${rider.id}/decision`, { decision: 'reject' });
    expect(res.status).toBe(400);
  });

  it('answers 404 for a malformed account id', async () => {
    await clients.admin.post('/api/admin/accounts/abc/decision', { decision: 'approve' }).expect(404);
    await clients.admin.post('/api/admin/accounts/-1/decision', { decision: 'approve' }).expect(404);
  });
});

describe('unknown routes', () => {
  it('answers a JSON 404 for an unknown API path', async () => {
    const res = await request(saddlestep.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });
});
