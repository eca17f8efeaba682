import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import type { APIRequestContext, BrowserContext, Page } from 'playwright-core';
import { DEMO_PASSWORD, DEMO_PEOPLE } from '@server/seed/demo-people';
import { launchBrowser, signIn, testBaseUrl, type BrowserSession } from '../support/browser';
import { attachmentText, waitForMails } from '../support/mail';
import sharp from 'sharp';

/*
 * The booking journey in the browser: a fitter publishes a week on the Availability page, then
 * riders in another time zone book, pay with Stripe test cards and get the confirmation e-mail.
 */

const FITTER_ZONE = 'Europe/Oslo';
const RIDER_ZONE = 'America/New_York';
const PASSWORD = 'a-long-enough-password';
const PHONE = { width: 390, height: 844 };

const uniqueEmail = (who: string) => `${who}-${randomUUID().slice(0, 8)}@test.example`;
const input = (page: Page, test: string) => page.locator(`[data-test="${test}"] input, input[data-test="${test}"], textarea[data-test="${test}"]`).first();

let session: BrowserSession;
const fitter = { id: 0, email: uniqueEmail('fitter'), name: 'Ingrid Booktest' };

async function csrfHeaders(request: APIRequestContext): Promise<Record<string, string>> {
  const res = await request.get('/api/auth/csrf');
  return { 'X-CSRF-Token': ((await res.json()) as { csrfToken: string }).csrfToken };
}

/** A tab of its own (own cookies), with the viewer's clock in `timeZone` and every request URL recorded. */
async function openTab(options: { timeZone: string; viewport?: { width: number; height: number } }): Promise<{ context: BrowserContext; page: Page; requests: string[] }> {
  const context = await session.browser.newContext({
    baseURL: testBaseUrl(),
    viewport: options.viewport ?? { width: 1280, height: 900 },
    timezoneId: options.timeZone,
    locale: 'en-US',
  });
  const page = await context.newPage();
  const requests: string[] = [];
  page.on('request', (request) => requests.push(request.url()));
  return { context, page, requests };
}

/**
 * Riders must have told us what hurts before booking. When the intake feature's gate says not
 * yet, submit a calm intake (no red flags, consent given) through its own API, as the form would.
 */
async function makeReadyToBook(page: Page): Promise<void> {
  const readiness = await page.request.get('/api/rider/booking-readiness');
  if (readiness.status() === 404) return;
  const body = (await readiness.json()) as { ready: boolean };
  if (body.ready) return;
  const { currentConsent, questionsToAsk } = await import('@shared/rider');
  const intake = {
    symptoms: [{ region: 'knee-front-left', pain: 3, kind: 'ache', timing: ['during-ride'], durationDays: 21 }],
    redFlagAnswers: Object.fromEntries(questionsToAsk({}, []).map((id) => [id, false])),
    goals: ['ride-without-pain'],
    consent: { kind: 'store-health-data', version: currentConsent('store-health-data')!.version, agreed: true },
  };
  const res = await page.request.post('/api/rider/intake/submit', { data: intake, headers: await csrfHeaders(page.request) });
  expect(res.status(), await res.text()).toBeLessThan(300);
}

/** Open Book, choose our fitter and wait for their week of slots. */
async function openFitterWeek(page: Page): Promise<void> {
  await page.goto('/book');
  const card = page.locator(`[data-test="fitter-${fitter.id}"]`);
  await card.waitFor();
  await card.locator('[data-test="choose-fitter"]').click();
  await page.locator('[data-test="slot"]').first().waitFor();
}

beforeAll(async () => {
  session = await launchBrowser();
  // A fitter of our own (fitters wait for the clinic's approval), so no other test shares the calendar.
  const { context, page } = await openTab({ timeZone: FITTER_ZONE });
  await page.goto('/');
  const registered = await page.request.post('/api/auth/register', {
    data: { role: 'fitter', displayName: fitter.name, email: fitter.email, password: PASSWORD, timeZone: FITTER_ZONE },
    headers: await csrfHeaders(page.request),
  });
  expect(registered.status()).toBe(201);
  fitter.id = ((await registered.json()) as { user: { id: number } }).user.id;
  await signIn(page, DEMO_PEOPLE.find((p) => p.role === 'admin')!.email, DEMO_PASSWORD);
  await page.waitForURL('**/admin');
  const approved = await page.request.post(`/api/admin/accounts/${fitter.id}/decision`, { data: { decision: 'approve' }, headers: await csrfHeaders(page.request) });
  expect(approved.status()).toBe(200);
  await context.close();
});
afterAll(async () => {
  await session?.close();
});

describe('booking in the browser', () => {
  it('lets a fitter set a week on the Availability page and publish it', async () => {
    const { context, page } = await openTab({ timeZone: FITTER_ZONE });
    await signIn(page, fitter.email, PASSWORD);
    await page.waitForURL('**/fitter');
    await page.locator('[data-test="set-availability"]').click();
    await page.waitForURL('**/fitter/availability');
    await page.locator('[data-test="week-editor"]').waitFor();

    // Every day 09:00–17:00 (the default hours of a new row).
    for (let weekday = 1; weekday <= 7; weekday += 1) await page.locator(`[data-test="add-window-${weekday}"]`).click();
    await expect(page.locator('[data-test="window-row"]').count()).resolves.toBe(7);

    // The shared schema checks the form before it is sent, with the message beside the row.
    const mondayEnd = page.locator('[data-test="weekday-1"] input[data-test="window-end"]');
    await mondayEnd.fill('08:00');
    await page.locator('[data-test="save-availability"]').click();
    await expect(page.locator('[data-test="error-window-0"]').innerText()).resolves.toBe('A window must end after it starts.');
    await expect(page.locator('[data-test="preview-invalid"]').isVisible()).resolves.toBe(true);
    await mondayEnd.fill('17:00');

    await input(page, 'bio').fill('Road and gravel riders with sore knees.');
    await input(page, 'fee').fill('75');
    await input(page, 'fee').blur();
    await page.locator('[data-test="published"]').click();

    // The live preview uses the same slot finder as the server: with 24 h notice, still plenty.
    const total = Number(await page.locator('[data-test="preview-total"] strong').innerText());
    expect(total).toBeGreaterThan(10);

    await page.locator('[data-test="save-availability"]').click();
    await expect(page.locator('.el-message--success').innerText()).resolves.toContain('Riders can book');

    await page.reload();
    await page.locator('[data-test="week-editor"]').waitFor();
    await expect(page.locator('[data-test="window-row"]').count()).resolves.toBe(7);
    await expect(input(page, 'fee').inputValue()).resolves.toBe('75.00');
    await context.close();
  });

  it('follows a new rider from registration through the intake and a photo to a paid, confirmed session and its invite', async () => {
    const { context, page, requests } = await openTab({ timeZone: RIDER_ZONE, viewport: PHONE });
    const email = uniqueEmail('rider');
    await page.goto('/register');
    await page.locator('[data-test="role-rider"]').click();
    await input(page, 'display-name').fill('Rosa Booktest');
    await input(page, 'email').fill(email);
    await input(page, 'password').fill(PASSWORD);
    // The time-zone select starts at the device's zone: New York here.
    await page.locator('[data-test="submit"]').click();
    await page.waitForURL('**/rider');

    // Tell us what hurts: the body map, the safety questions, consent, then a photo with progress.
    await page.locator('[data-test="next-action-go"]').click();
    await page.waitForURL('**/rider/tell-us-what-hurts');
    await page.locator('[data-test="region-knee-front-left"]').click();
    await page.locator('[data-test="pain-knee-front-left-4"]').click();
    await page.locator('[data-test="kind-knee-front-left-ache"]').click();
    await page.locator('[data-test="timing-knee-front-left-during-ride"]').click();
    await page.locator('[data-test="duration-knee-front-left-21"]').click();
    const noButtons = page.locator('[data-test^="flag-"][data-test$="-no"]');
    for (let i = 0, n = await noButtons.count(); i < n; i += 1) await noButtons.nth(i).click();
    await page.locator('[data-test="goal-ride-without-pain"]').click();
    await page.locator('[data-test="consent"]').click();
    await page.locator('[data-test="intake-submit"]').click();
    await expect(page.locator('[data-test="triage-result"]').getAttribute('data-level')).resolves.toBe('none');
    const png = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#1f4d45' } }).png().toBuffer();
    await page.locator('[data-test="upload-view-side-crank-3"]').click();
    await page.locator('[data-test="upload-input"]').setInputFiles({ name: 'side-on.png', mimeType: 'image/png', buffer: png });
    await page.locator('[data-test="upload-progress"][data-status="done"]').waitFor();

    await page.goto('/rider');
    await page.locator('[data-test="book-session"]').click();
    await page.waitForURL('**/book');
    await openFitterWeek(page);
    await expect(page.locator('[data-test="slot-zone"]').innerText()).resolves.toContain('America/New York');

    const slot = page.locator('[data-test="slot"]').first();
    const start = (await slot.getAttribute('data-start'))!;
    const time = new Intl.DateTimeFormat('en-US', { timeZone: RIDER_ZONE, hour: 'numeric', minute: '2-digit' }).format(new Date(start));
    await expect(slot.innerText()).resolves.toContain(time);

    await slot.click();
    await page.waitForURL('**/consultations/*/pay');
    await expect(page.locator('[data-test="hold-countdown"]').innerText()).resolves.toMatch(/\d+:\d{2}/);
    await expect(page.locator('[data-test="consultation-fee"]').innerText()).resolves.toBe('€75.00');
    // The refund rules in force are on the page before Pay (the demo studio's defaults).
    const policy = page.locator('[data-test="refund-policy"] li').first();
    await policy.waitFor();
    await expect(page.locator('[data-test="refund-policy"]').innerText()).resolves.toMatch(/24 h or more before the start: the full fee back[\s\S]*less than 24 h before the start: 50 % back[\s\S]*no-show\): no refund/);
    await page.locator('[data-test="card-tok_visa"]').click();
    await page.locator('[data-test="pay"]').click();

    const confirmed = page.locator('[data-test="booking-confirmed"]');
    await confirmed.waitFor();
    const text = await confirmed.innerText();
    expect(text).toContain('Booked');
    expect(text).toContain(time);
    expect(text).toContain('America/New York');
    await expect(page.locator('[data-test="consultation-status"]').innerText()).resolves.toBe('Booked');

    // The confirmation e-mail carries a calendar invite for the same instant.
    const [mail] = await waitForMails(email, { subject: /^Booked:/ });
    expect(mail, 'no confirmation e-mail').toBeDefined();
    expect(mail!.subject).toContain('America/New_York');
    const invite = await attachmentText(mail!, 'invite.ics');
    expect(invite).toContain('METHOD:REQUEST');
    expect(invite).toMatch(new RegExp(`DTSTART[^:\\r\\n]*:${start.replace(/[-:]/g, '').replace(/\.\d{3}/, '')}`));

    const origin = new URL(testBaseUrl()).origin;
    expect(requests.filter((url) => !url.startsWith(origin) && !url.startsWith('data:') && !url.startsWith('blob:'))).toEqual([]);
    await context.close();
  });

  it('shows a declined card clearly and gives the held time back', async () => {
    const { context, page } = await openTab({ timeZone: RIDER_ZONE, viewport: PHONE });
    await page.goto('/');
    const registered = await page.request.post('/api/auth/register', {
      data: { role: 'rider', displayName: 'Dana Declined', email: uniqueEmail('declined'), password: PASSWORD, timeZone: RIDER_ZONE },
      headers: await csrfHeaders(page.request),
    });
    expect(registered.status()).toBe(201);
    await makeReadyToBook(page);

    await openFitterWeek(page);
    const start = (await page.locator('[data-test="slot"]').first().getAttribute('data-start'))!;
    await page.locator('[data-test="slot"]').first().click();
    await page.waitForURL('**/consultations/*/pay');
    await page.locator('[data-test="card-tok_chargeDeclined"]').click();
    await page.locator('[data-test="pay"]').click();

    const error = page.locator('[data-test="payment-error"]');
    await error.waitFor();
    await expect(error.innerText()).resolves.toMatch(/declined/i);
    await expect(page.locator('[data-test="pay"]').count()).resolves.toBe(0);

    // The hold was released, so the same time is offered again.
    await page.locator('[data-test="choose-again"]').click();
    await page.waitForURL(`**/book?fitter=${fitter.id}`);
    await page.locator(`[data-test="slot"][data-start="${start}"]`).waitFor();
    await context.close();
  });
});
