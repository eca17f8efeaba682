import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { ROLES, type Role } from '@shared/auth';
import type { SaddlestepApp } from '@server/app';
import { browserLikeAgent, startTestApp } from '../support/app';
import { buildUser, signedInAs, TEST_PASSWORD } from '../support/factories';

/**
 * Every guarded route and the one role allowed on it. A route added to the router without a
 * line here is still guarded, but add it so this matrix keeps covering the whole API.
 */
const GUARDED_ROUTES: { method: 'get' | 'post'; path: string; role: Role; body?: object }[] = [
  { method: 'get', path: '/api/rider/home', role: 'rider' },
  { method: 'get', path: '/api/fitter/home', role: 'fitter' },
  { method: 'get', path: '/api/physio/home', role: 'physio' },
  { method: 'get', path: '/api/admin/home', role: 'admin' },
  { method: 'get', path: '/api/admin/accounts/pending', role: 'admin' },
  { method: 'post', path: '/api/admin/accounts/4294967295/decision', role: 'admin', body: { decision: 'approve' } },
];

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
    for (const role of ROLES) {
      const allowed = route.role === role;
      it(`${route.method.toUpperCase()} ${route.path} as ${role} → ${allowed ? 'allowed' : '403'}`, async () => {
        const client = clients[role];
        const res = route.method === 'get' ? await client.get(route.path) : await client.post(route.path, route.body);
        if (allowed) {
          // The decision route answers 404 for an account that does not exist; it got past the guard.
          expect([200, 404]).toContain(res.status);
        } else {
          expect(res.status).toBe(403);
          expect(res.body.error.code).toBe('forbidden');
        }
      });
    }
    it(`${route.method.toUpperCase()} ${route.path} signed out → 401`, async () => {
      const anonymous = await browserLikeAgent(saddlestep.app);
      const res = route.method === 'get' ? await anonymous.get(route.path) : await anonymous.post(route.path, route.body);
      expect(res.status).toBe(401);
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
