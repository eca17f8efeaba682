import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import type { Page } from 'playwright-core';
import type { SaddlestepApp } from '@server/app';
import { Consultation } from '@server/models';
import { startTestApp } from '../support/app';
import { TEST_PASSWORD } from '../support/factories';
import { buildFitter, isoDateIn, OPEN_WEEK, riderReadyToBook } from '../support/booking-factories';
import { launchBrowser, signIn, type BrowserSession } from '../support/browser';
import { routeFakeStripeJs } from '../support/fake-stripe-js';

/*
 * Paying with Stripe's card field, as a rider would where the studio has set its Stripe keys:
 * the checkout loads Stripe.js (here its stand-in, as this machine cannot reach js.stripe.com),
 * the rider types a card, the browser makes a token, and the server charges it through the
 * Stripe SDK against the local Stripe fake. This app has a publishable key of its own, so it
 * runs beside the launcher's server on a port of its own.
 */

const PUBLISHABLE = 'pk_test_saddlestepBrowserCardField';
let saddlestep: SaddlestepApp;
let baseUrl: string;
let session: BrowserSession;
beforeAll(async () => {
  saddlestep = await startTestApp({ STRIPE_PUBLISHABLE_KEY: PUBLISHABLE, CLIENT_DIST: path.resolve('dist') });
  await new Promise<void>((resolve) => saddlestep.httpServer.listen(0, '127.0.0.1', resolve));
  baseUrl = `http://127.0.0.1:${(saddlestep.httpServer.address() as AddressInfo).port}`;
  session = await launchBrowser();
});
afterAll(async () => {
  await session?.close();
  await saddlestep?.close();
});

/** A rider signed in on the checkout page of a fresh hold, with Stripe.js served or not. */
async function atCheckout(options: { unreachable?: boolean; startsAt?: string } = {}) {
  const { fitter } = await buildFitter({ availability: { ...OPEN_WEEK, windows: OPEN_WEEK.windows.map((w) => ({ ...w, start: '00:00', end: '24:00' })) } });
  const rider = await riderReadyToBook(saddlestep.app);
  const held = await rider.post('/api/consultations', { fitterId: fitter.id, startsAt: options.startsAt ?? `${isoDateIn(4)}T10:00:00Z` }).expect(201);
  const id = held.body.consultation.id as number;
  const context = await session.browser.newContext({ baseURL: baseUrl, viewport: { width: 1280, height: 900 } });
  await routeFakeStripeJs(context, options);
  const page = await context.newPage();
  const requests: string[] = [];
  page.on('request', (r) => requests.push(r.url()));
  await signIn(page, rider.user.email, TEST_PASSWORD);
  await page.waitForURL('**/rider');
  await page.goto(`/consultations/${id}/pay`);
  return { id, context, page, requests };
}

const typeCard = async (page: Page, number: string) => {
  const field = page.locator('[data-test="fake-card-number"]');
  await field.fill('');
  await field.pressSequentially(number);
};
const statusOf = async (id: number) => (await Consultation.findByPk(id))?.status;

describe("Stripe's card field at checkout", () => {
  it('loads Stripe.js with the publishable key, refuses an expired card in the field, then books with a good one', async () => {
    const { id, context, page, requests } = await atCheckout();
    try {
      await page.locator('[data-test="card-field"][data-state="ready"]').waitFor();
      expect(await page.locator('.card-chooser').count()).toBe(0);
      expect(requests.some((url) => /^https:\/\/js\.stripe\.com\/[a-z0-9]+\/stripe\.js/.test(url))).toBe(true);
      expect(await page.evaluate(() => (window as unknown as { __fakeStripeKeys: string[] }).__fakeStripeKeys)).toEqual([PUBLISHABLE]);

      const pay = page.locator('[data-test="pay"]');
      expect(await pay.isDisabled()).toBe(true);
      // Four days ahead, the general rules apply as they stand.
      await page.locator('[data-test="refund-policy"] li').first().waitFor();
      expect(await page.locator('[data-test="policy-inside-window"]').count()).toBe(0);
      await typeCard(page, '4000000000000069');
      await expect.poll(() => pay.isDisabled()).toBe(false);
      await pay.click();
      await expect.poll(() => page.locator('[data-test="card-field-error"]').textContent()).toContain('Your card has expired.');
      expect(await statusOf(id)).not.toBe('booked');

      await typeCard(page, '4242 4242 4242 4242');
      await pay.click();
      await page.waitForURL(`**/consultations/${id}`);
      expect(await statusOf(id)).toBe('booked');
      // Only Stripe.js came from outside our origin; the card number never went to our server.
      expect(requests.filter((url) => !url.startsWith(baseUrl)).every((url) => url.startsWith('https://js.stripe.com/'))).toBe(true);
    } finally {
      await context.close();
    }
  }, 60_000);

  it('shows the bank’s refusal and releases the time when the card is declined', async () => {
    const { id, context, page } = await atCheckout();
    try {
      await page.locator('[data-test="card-field"][data-state="ready"]').waitFor();
      await typeCard(page, '4000000000000002');
      await page.locator('[data-test="pay"]').click();
      await page.locator('[data-test="payment-error"]').waitFor();
      expect(await page.locator('[data-test="payment-error"]').textContent()).toMatch(/declined/i);
      await page.locator('[data-test="choose-again"]').waitFor();
      expect(await statusOf(id)).toBe('cancelled');
    } finally {
      await context.close();
    }
  }, 60_000);

  it('says so when Stripe.js cannot load, and loads it on "try again"', async () => {
    const { context, page } = await atCheckout({ unreachable: true });
    try {
      await page.locator('[data-test="card-field-failed"]').waitFor();
      expect(await page.locator('[data-test="pay"]').isDisabled()).toBe(true);
      await routeFakeStripeJs(context);
      await page.locator('[data-test="card-field-failed"] button').click();
      await page.locator('[data-test="card-field"][data-state="ready"]').waitFor();
      await page.locator('[data-test="fake-card-number"]').waitFor();
    } finally {
      await context.close();
    }
  }, 60_000);

  it('keeps a paid session the rider cancelled on My fit, under "Cancelled recently", with its refund', async () => {
    const { id, context, page } = await atCheckout();
    try {
      await page.locator('[data-test="card-field"][data-state="ready"]').waitFor();
      await typeCard(page, '4242424242424242');
      await page.locator('[data-test="pay"]').click();
      await page.waitForURL(`**/consultations/${id}`);
      const csrf = (await (await page.request.get('/api/auth/csrf')).json()) as { csrfToken: string };
      const cancelled = await page.request.post(`/api/consultations/${id}/cancel`, { data: {}, headers: { 'X-CSRF-Token': csrf.csrfToken } });
      expect(cancelled.status()).toBe(200);
      await page.goto('/rider');
      const recent = page.locator('[data-test="recently-cancelled"]');
      await recent.locator(`[data-test="consultation-${id}"] a`).click();
      await page.waitForURL(`**/consultations/${id}`);
      await expect(page.locator('[data-test="consultation-refunded"]').innerText()).resolves.toMatch(/refunded to the card/);
      await expect(page.locator('[data-test="consultation-payment"]').innerText()).resolves.toMatch(/^Paid: /);
    } finally {
      await context.close();
    }
  }, 60_000);

  it('says plainly, for a session less than 24 h away, what cancelling would return and that it cannot be moved', async () => {
    const inSixHours = new Date(Math.ceil((Date.now() + 6 * 3_600_000) / 3_600_000) * 3_600_000).toISOString();
    const { context, page } = await atCheckout({ startsAt: inSixHours });
    try {
      const line = page.locator('[data-test="policy-inside-window"]');
      await line.waitFor();
      await expect(line.innerText()).resolves.toBe('This session starts in less than 24 h: if you cancel after paying, €45.00 comes back, and it can no longer be moved.');
    } finally {
      await context.close();
    }
  }, 60_000);
});
