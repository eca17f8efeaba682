import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { ConfigError, loadConfig } from '@server/config';
import type { SaddlestepApp } from '@server/app';
import { cardEntryFor } from '@server/payments/card-entry';
import { startTestApp } from '../support/app';
import { signedInAs } from '../support/factories';
import { buildFitter, isoDateIn, riderReadyToBook } from '../support/booking-factories';

/*
 * How the checkout takes cards. With a publishable key the page shows Stripe's card field and
 * the CSP lets Stripe.js in; without one, development gets the test-card chooser and production
 * gets nothing; the server charges whatever `tok_` token Stripe.js made, the same way.
 */

const PUBLISHABLE = 'pk_test_saddlestepCardField';
let plain: SaddlestepApp;
let withCardField: SaddlestepApp;
beforeAll(async () => {
  plain = await startTestApp();
  withCardField = await startTestApp({ STRIPE_PUBLISHABLE_KEY: PUBLISHABLE });
});
afterAll(async () => {
  await plain?.close();
  await withCardField?.close();
});

describe('GET /api/payments/card-entry', () => {
  it('offers the test-card chooser in development and test, when no publishable key is set', async () => {
    const rider = await signedInAs(plain.app, 'rider');
    const res = await rider.get('/api/payments/card-entry').expect(200);
    expect(res.body.method).toBe('test_cards');
    expect(res.body.cards.map((c: { token: string }) => c.token)).toContain('tok_visa');
  });

  it("offers Stripe's card field with the publishable key (never the secret) when one is set", async () => {
    const rider = await signedInAs(withCardField.app, 'rider');
    const res = await rider.get('/api/payments/card-entry').expect(200);
    expect(res.body).toEqual({ method: 'stripe_card', publishableKey: PUBLISHABLE });
    expect(JSON.stringify(res.body)).not.toContain('sk_');
  });

  it('is for riders only', async () => {
    const fitter = await signedInAs(withCardField.app, 'fitter');
    await fitter.get('/api/payments/card-entry').expect(403);
    await request(withCardField.app).get('/api/payments/card-entry').expect(401);
  });
});

describe('choosing the card entry', () => {
  it('never offers test cards in production, and nothing without Stripe', () => {
    expect(cardEntryFor({ NODE_ENV: 'production', STRIPE_PUBLISHABLE_KEY: undefined }, true)).toEqual({ method: 'none' });
    expect(cardEntryFor({ NODE_ENV: 'production', STRIPE_PUBLISHABLE_KEY: 'pk_live_abc' }, true)).toEqual({ method: 'stripe_card', publishableKey: 'pk_live_abc' });
    expect(cardEntryFor({ NODE_ENV: 'development', STRIPE_PUBLISHABLE_KEY: 'pk_test_abc' }, false)).toEqual({ method: 'none' });
    expect(cardEntryFor({ NODE_ENV: 'development', STRIPE_PUBLISHABLE_KEY: undefined }, true).method).toBe('test_cards');
  });

  it('refuses a publishable key without a secret key, or with one of the other mode', () => {
    const base = { ...process.env, CLIENT_DIST: '' };
    expect(() => loadConfig({ ...base, STRIPE_SECRET_KEY: undefined, STRIPE_PUBLISHABLE_KEY: 'pk_test_abc' })).toThrow(/set STRIPE_SECRET_KEY too/);
    expect(() => loadConfig({ ...base, STRIPE_SECRET_KEY: 'sk_test_abc', STRIPE_PUBLISHABLE_KEY: 'pk_live_abc' })).toThrow(/both be live keys or both be test keys/);
    expect(() => loadConfig({ ...base, STRIPE_SECRET_KEY: 'sk_live_abc', STRIPE_PUBLISHABLE_KEY: 'pk_test_abc' })).toThrow(ConfigError);
    expect(() => loadConfig({ ...base, STRIPE_SECRET_KEY: 'sk_test_abc', STRIPE_PUBLISHABLE_KEY: 'sk_test_abc' })).toThrow(/must start with pk_test_ or pk_live_/);
    expect(loadConfig({ ...base, STRIPE_SECRET_KEY: 'rk_live_abc', STRIPE_PUBLISHABLE_KEY: 'pk_live_abc' }).STRIPE_PUBLISHABLE_KEY).toBe('pk_live_abc');
  });
});

describe('content security policy', () => {
  const directive = (csp: string, name: string) => csp.split(';').map((d) => d.trim()).find((d) => d.startsWith(`${name} `)) ?? '';

  it('lets in nothing but our own origin when there is no card field', async () => {
    const csp = (await request(plain.app).get('/api/health')).headers['content-security-policy'] as string;
    expect(csp).not.toContain('stripe.com');
    expect(directive(csp, 'frame-src')).toBe("frame-src 'self'");
  });

  it("lets in Stripe.js, its frames and its token API when the card field is on (Stripe's published CSP)", async () => {
    const csp = (await request(withCardField.app).get('/api/health')).headers['content-security-policy'] as string;
    expect(directive(csp, 'script-src')).toContain('https://js.stripe.com');
    expect(directive(csp, 'frame-src')).toContain('https://js.stripe.com');
    expect(directive(csp, 'frame-src')).toContain('https://hooks.stripe.com');
    expect(directive(csp, 'connect-src')).toContain('https://api.stripe.com');
    expect(directive(csp, 'default-src')).toBe("default-src 'self'");
  });
});

describe('paying with a token from the card field', () => {
  it('charges a token Stripe.js made the same way as a test card, and refuses a malformed one', async () => {
    const { fitter } = await buildFitter();
    const rider = await riderReadyToBook(withCardField.app);
    const held = await rider.post('/api/consultations', { fitterId: fitter.id, startsAt: `${isoDateIn(3)}T10:00:00Z` }).expect(201);
    const id = held.body.consultation.id as number;

    const bad = await rider.post(`/api/consultations/${id}/payment`, { token: 'pm_card_visa', attemptKey: randomUUID() }).expect(400);
    expect(bad.body.error.message).toMatch(/card token is not valid/);

    // The stateful Stripe fake knows Stripe's documented test tokens; Stripe.js makes real ones.
    const paid = await rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(200);
    expect(paid.body.consultation).toMatchObject({ status: 'booked', payment: { status: 'succeeded' } });
  });
});
