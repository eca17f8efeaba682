import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Op } from 'sequelize';
import { User } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { browserLikeAgent, startTestApp } from '../support/app';
import { TEST_PASSWORD, uniqueEmail } from '../support/factories';

let saddlestep: SaddlestepApp;
beforeAll(async () => {
  saddlestep = await startTestApp();
});
afterAll(async () => {
  await saddlestep.close();
});

const valid = () => ({ email: uniqueEmail('bad'), password: TEST_PASSWORD, displayName: 'Avery Test', role: 'rider', timeZone: 'Europe/Paris' });

/** Accounts this file could have created (other test files run beside it and add their own). */
const ourAccounts = () => User.count({ where: { email: { [Op.startsWith]: 'bad-' } } });

async function expectRefusedWithoutWrite(body: unknown, expected: { status?: number; field?: string; message?: RegExp }) {
  const client = await browserLikeAgent(saddlestep.app);
  const before = await ourAccounts();
  // Sent as raw JSON text so bodies like `42` or `null` reach the server exactly as written.
  const res = await client.agent.post('/api/auth/register').set('X-CSRF-Token', client.csrfToken).set('Content-Type', 'application/json').send(JSON.stringify(body));
  expect(res.status).toBe(expected.status ?? 400);
  expect(res.body.error.message).toEqual(expect.any(String));
  expect(JSON.stringify(res.body)).not.toMatch(/sequelize|SqlError|stack|at \w+ \(/i);
  if (expected.field) expect(res.body.error.fields?.[expected.field]).toEqual(expect.any(String));
  if (expected.message) expect(res.body.error.message).toMatch(expected.message);
  expect(await ourAccounts()).toBe(before);
  return res;
}

describe('bad input to POST /api/auth/register', () => {
  it('answers malformed JSON with 400 and a clear message', async () => {
    const client = await browserLikeAgent(saddlestep.app);
    const res = await client.agent.post('/api/auth/register').set('X-CSRF-Token', client.csrfToken).set('Content-Type', 'application/json').send('{"email": "a@b.example",');
    expect(res.status).toBe(400);
    expect(res.body.error).toEqual({ code: 'malformed_json', message: 'The request body is not valid JSON.' });
  });

  it('answers an oversized body with 413', async () => {
    const client = await browserLikeAgent(saddlestep.app);
    const res = await client.post('/api/auth/register', { ...valid(), displayName: 'x'.repeat(200_000) });
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload_too_large');
  });

  it.each(['email', 'password', 'displayName', 'role', 'timeZone'])('names the missing field %s', async (field) => {
    const body: Record<string, unknown> = valid();
    delete body[field];
    await expectRefusedWithoutWrite(body, { field });
  });

  it('refuses extra fields, such as a status smuggled in', async () => {
    await expectRefusedWithoutWrite({ ...valid(), status: 'active', role: 'rider' }, { message: /Unexpected field: status/ });
  });

  it('refuses an unknown role', async () => {
    await expectRefusedWithoutWrite({ ...valid(), role: 'superuser' }, { field: 'role' });
  });

  it('refuses an unknown time zone', async () => {
    await expectRefusedWithoutWrite({ ...valid(), timeZone: 'Mars/Olympus_Mons' }, { field: 'timeZone' });
  });

  it.each([
    ['email', 'a'.repeat(250) + '@x.example'],
    ['displayName', 'n'.repeat(81)],
    ['password', 'p'.repeat(129)],
  ])('refuses an over-long %s', async (field, value) => {
    await expectRefusedWithoutWrite({ ...valid(), [field]: value }, { field });
  });

  it('refuses a too-short password', async () => {
    await expectRefusedWithoutWrite({ ...valid(), password: 'short' }, { field: 'password', message: /at least 10/ });
  });

  it.each([
    ['a JSON array', []],
    ['a number', 42],
    ['null', null],
    ['wrong types', { email: 5, password: true, displayName: {}, role: [], timeZone: 1 }],
  ])('refuses %s as the body', async (_label, body) => {
    await expectRefusedWithoutWrite(body, {});
  });

  it('refuses a script-like display name', async () => {
    await expectRefusedWithoutWrite({ ...valid(), displayName: '<script>alert(1)</script>' }, { field: 'displayName' });
  });

  it('stores SQL-like text as plain text and never runs it', async () => {
    const client = await browserLikeAgent(saddlestep.app);
    const displayName = "Robert'); DROP TABLE users;--";
    const res = await client.post('/api/auth/register', { ...valid(), displayName });
    expect(res.status).toBe(201);
    expect(res.body.user.displayName).toBe(displayName);
    expect(await User.count()).toBeGreaterThan(0);
  });

  it('refuses an SQL-like e-mail as an invalid address', async () => {
    await expectRefusedWithoutWrite({ ...valid(), email: "x' OR '1'='1" }, { field: 'email' });
  });
});

describe('bad input to POST /api/auth/sign-in', () => {
  it('names missing fields instead of failing', async () => {
    const client = await browserLikeAgent(saddlestep.app);
    const res = await client.post('/api/auth/sign-in', {});
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(expect.arrayContaining(['email', 'password']));
  });

  it('answers a form-encoded body like a missing one, not with a 500', async () => {
    const client = await browserLikeAgent(saddlestep.app);
    const res = await client.agent.post('/api/auth/sign-in').set('X-CSRF-Token', client.csrfToken).type('form').send('email=a@b.example&password=x');
    expect(res.status).toBe(400);
  });

  it('treats SQL-like input as a failed sign-in', async () => {
    const client = await browserLikeAgent(saddlestep.app);
    const res = await client.post('/api/auth/sign-in', { email: "' OR 1=1 --", password: "' OR '1'='1" });
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('sign_in_failed');
  });
});
