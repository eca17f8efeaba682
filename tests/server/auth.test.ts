import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { AuditEntry, User } from '@server/models';
import { SESSION_COOKIE, type SaddlestepApp } from '@server/app';
import { browserLikeAgent, startTestApp } from '../support/app';
import { buildUser, signedInAs, TEST_PASSWORD, uniqueEmail } from '../support/factories';

let saddlestep: SaddlestepApp;
beforeAll(async () => {
  saddlestep = await startTestApp();
});
afterAll(async () => {
  await saddlestep.close();
});

const registration = (overrides: Record<string, unknown> = {}) => ({
  email: uniqueEmail('reg'),
  password: TEST_PASSWORD,
  displayName: 'Rowan Test',
  role: 'rider',
  timeZone: 'Europe/Berlin',
  ...overrides,
});

function sessionCookie(res: request.Response): string | undefined {
  const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
  return cookies.find((c) => c.startsWith(`${SESSION_COOKIE}=`))?.split(';')[0];
}

describe('POST /api/auth/register', () => {
  it('creates an active rider, signs them in and never returns the password hash', async () => {
    const client = await browserLikeAgent(saddlestep.app);
    const body = registration({ email: 'Mixed.Case@Test.Example' });
    const res = await client.post('/api/auth/register', { ...body, email: uniqueEmail('Mixed') });
    expect(res.status).toBe(201);
    expect(res.body.signedIn).toBe(true);
    expect(res.body.user).toMatchObject({ role: 'rider', status: 'active', timeZone: 'Europe/Berlin' });
    expect(JSON.stringify(res.body)).not.toMatch(/passwordHash|\$2[aby]\$/);
    client.csrfToken = res.body.csrfToken;
    const me = await client.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe(res.body.user.email);
  });

  it('stores the e-mail in lower case and the password as a bcrypt hash of cost 10 or more', async () => {
    const client = await browserLikeAgent(saddlestep.app);
    const email = uniqueEmail('UPPER').toUpperCase();
    await client.post('/api/auth/register', registration({ email })).expect(201);
    const user = await User.findOne({ where: { email: email.toLowerCase() } });
    expect(user).not.toBeNull();
    const cost = Number(user!.passwordHash.split('$')[2]);
    expect(cost).toBeGreaterThanOrEqual(10);
  });

  it.each(['fitter', 'physio'])('registers a %s as pending, without signing them in', async (role) => {
    const client = await browserLikeAgent(saddlestep.app);
    const res = await client.post('/api/auth/register', registration({ role }));
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ signedIn: false, user: { role, status: 'pending' } });
    await client.get('/api/auth/me').expect(401);
  });

  it('refuses a second account with the same e-mail with 409', async () => {
    const email = uniqueEmail('dup');
    await (await browserLikeAgent(saddlestep.app)).post('/api/auth/register', registration({ email })).expect(201);
    const res = await (await browserLikeAgent(saddlestep.app)).post('/api/auth/register', registration({ email: email.toUpperCase() }));
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/already exists/);
  });

  it('refuses to let anyone register as an admin', async () => {
    const client = await browserLikeAgent(saddlestep.app);
    const email = uniqueEmail('wannabe');
    const res = await client.post('/api/auth/register', registration({ email, role: 'admin' }));
    expect(res.status).toBe(400);
    expect(res.body.error.fields.role).toMatch(/rider, bike fitter or physiotherapist/);
    expect(await User.count({ where: { email } })).toBe(0);
  });

  it('writes an audit row for the registration', async () => {
    const client = await browserLikeAgent(saddlestep.app);
    const res = await client.post('/api/auth/register', registration()).expect(201);
    const rows = await AuditEntry.findAll({ where: { action: 'user.register', subjectId: String(res.body.user.id) } });
    expect(rows).toHaveLength(1);
  });
});

describe('POST /api/auth/sign-in', () => {
  it('signs in an active user and regenerates the session id', async () => {
    const user = await buildUser({ role: 'fitter' });
    const client = await browserLikeAgent(saddlestep.app);
    const before = await client.get('/api/auth/csrf');
    const cookieBefore = sessionCookie(before);
    expect(cookieBefore).toBeDefined();
    const res = await client.post('/api/auth/sign-in', { email: user.email.toUpperCase(), password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ id: user.id, role: 'fitter' });
    const cookieAfter = sessionCookie(res);
    expect(cookieAfter).toBeDefined();
    expect(cookieAfter).not.toBe(cookieBefore);
    expect(res.body.csrfToken).toEqual(expect.any(String));
  });

  it('gives the same answer for a wrong password and an unknown e-mail', async () => {
    const user = await buildUser();
    const wrongPassword = await (await browserLikeAgent(saddlestep.app)).post('/api/auth/sign-in', { email: user.email, password: 'not-the-password' });
    const unknownEmail = await (await browserLikeAgent(saddlestep.app)).post('/api/auth/sign-in', { email: uniqueEmail('nobody'), password: TEST_PASSWORD });
    expect(wrongPassword.status).toBe(401);
    expect(unknownEmail.status).toBe(401);
    expect(wrongPassword.body).toEqual(unknownEmail.body);
    expect(wrongPassword.body.error.message).toBe('That e-mail and password do not match an account.');
  });

  it('refuses a pending fitter with a clear message, only after the right password', async () => {
    const user = await buildUser({ role: 'fitter', status: 'pending' });
    const res = await (await browserLikeAgent(saddlestep.app)).post('/api/auth/sign-in', { email: user.email, password: TEST_PASSWORD });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('account_pending');
    const wrong = await (await browserLikeAgent(saddlestep.app)).post('/api/auth/sign-in', { email: user.email, password: 'wrong-password-x' });
    expect(wrong.body.error.code).toBe('sign_in_failed');
  });

  it('refuses a disabled account', async () => {
    const user = await buildUser({ status: 'disabled' });
    const res = await (await browserLikeAgent(saddlestep.app)).post('/api/auth/sign-in', { email: user.email, password: TEST_PASSWORD });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('account_disabled');
  });

  it('sets an httpOnly, SameSite session cookie', async () => {
    const user = await buildUser();
    const res = await (await browserLikeAgent(saddlestep.app)).post('/api/auth/sign-in', { email: user.email, password: TEST_PASSWORD });
    const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith(SESSION_COOKIE));
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it('signs out a user whose account is disabled after sign-in', async () => {
    const user = await buildUser();
    const client = await browserLikeAgent(saddlestep.app);
    await client.post('/api/auth/sign-in', { email: user.email, password: TEST_PASSWORD }).expect(200);
    await User.update({ status: 'disabled' }, { where: { id: user.id } });
    await client.get('/api/auth/me').expect(401);
  });
});

describe('POST /api/auth/sign-out', () => {
  it('ends the session', async () => {
    const user = await buildUser();
    const client = await browserLikeAgent(saddlestep.app);
    const res = await client.post('/api/auth/sign-in', { email: user.email, password: TEST_PASSWORD });
    client.csrfToken = res.body.csrfToken;
    await client.get('/api/auth/me').expect(200);
    await client.post('/api/auth/sign-out').expect(204);
    await client.get('/api/auth/me').expect(401);
  });

  it('answers 401 when nobody is signed in', async () => {
    const client = await browserLikeAgent(saddlestep.app);
    await client.post('/api/auth/sign-out').expect(401);
  });
});

describe('cross-site request forgery', () => {
  it('refuses a state-changing request without the CSRF token', async () => {
    const email = uniqueEmail('csrf');
    const res = await request(saddlestep.app).post('/api/auth/register').send(registration({ email }));
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf_failed');
    expect(await User.count({ where: { email } })).toBe(0);
  });

  it('refuses a token from another session', async () => {
    const mine = await browserLikeAgent(saddlestep.app);
    const theirs = await browserLikeAgent(saddlestep.app);
    const res = await mine.agent.post('/api/auth/register').set('X-CSRF-Token', theirs.csrfToken).send(registration());
    expect(res.status).toBe(403);
  });
});

describe('GET /api/auth/me', () => {
  it('answers 401 with a JSON error when signed out', async () => {
    const res = await request(saddlestep.app).get('/api/auth/me');
    expect(res.status).toBe(401);
    expect(res.body.error).toEqual({ code: 'not_signed_in', message: 'Please sign in to continue.' });
  });
});

describe('PATCH /api/auth/me', () => {
  it('changes the name and time zone of any role, and audits which fields changed', async () => {
    for (const role of ['rider', 'fitter', 'physio', 'admin'] as const) {
      const client = await signedInAs(saddlestep.app, role);
      const res = await client.agent.patch('/api/auth/me').set('X-CSRF-Token', client.csrfToken).send({ displayName: 'Renamed Person', timeZone: 'Asia/Tokyo' });
      expect(res.status).toBe(200);
      expect(res.body.user).toMatchObject({ displayName: 'Renamed Person', timeZone: 'Asia/Tokyo', role });
      expect((await client.get('/api/auth/me')).body.user.timeZone).toBe('Asia/Tokyo');
      const audit = await AuditEntry.findOne({ where: { action: 'account.settings_changed', subjectId: client.user.id } });
      expect(audit?.detail).toEqual({ fields: ['displayName', 'timeZone'] });
    }
  });

  it('refuses an unknown zone, a script-like name, extra fields and a role change, and writes nothing', async () => {
    const client = await signedInAs(saddlestep.app, 'rider');
    const bodies = [
      [{ displayName: 'Ok Name', timeZone: 'Mars/Olympus' }, /time zone from the list/],
      [{ displayName: '<script>x</script>', timeZone: 'UTC' }, /cannot contain < or >/],
      [{ displayName: 'Ok Name', timeZone: 'UTC', role: 'admin' }, /Unexpected field: role/],
      [{ displayName: 'x'.repeat(81), timeZone: 'UTC' }, /at most 80 characters/],
    ] as const;
    for (const [body, message] of bodies) {
      const res = await client.agent.patch('/api/auth/me').set('X-CSRF-Token', client.csrfToken).send(body);
      expect(res.status).toBe(400);
      expect(res.body.error.message).toMatch(message);
    }
    const stored = await User.findByPk(client.user.id);
    expect(stored).toMatchObject({ displayName: client.user.displayName, timeZone: client.user.timeZone, role: 'rider' });
  });

  it('needs a session and the forgery token', async () => {
    const guest = await browserLikeAgent(saddlestep.app);
    expect((await guest.patch('/api/auth/me', { displayName: 'A', timeZone: 'UTC' })).status).toBe(401);
    const client = await signedInAs(saddlestep.app, 'rider');
    expect((await client.agent.patch('/api/auth/me').send({ displayName: 'A', timeZone: 'UTC' })).status).toBe(403);
  });
});
