import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import type { APIRequestContext, Page } from 'playwright-core';
import { DEMO_PASSWORD, DEMO_PEOPLE } from '@server/seed/demo-people';
import { launchBrowser, openPage, signIn, type BrowserSession } from '../support/browser';

/*
 * The Clinic screen in the browser: the demo admin approves a fitter who just registered, and
 * changes a planner cap inside its hard safety bound; a value outside the bound is refused.
 */

const ADMIN = DEMO_PEOPLE.find((p) => p.role === 'admin')!;
const PASSWORD = 'a-long-enough-password';
const input = (page: Page, test: string) => page.locator(`[data-test="${test}"] input, input[data-test="${test}"], [data-test="${test}"] textarea, textarea[data-test="${test}"]`).first();

let session: BrowserSession;
beforeAll(async () => {
  session = await launchBrowser();
});
afterAll(async () => {
  await session?.close();
});

async function csrfHeaders(request: APIRequestContext): Promise<Record<string, string>> {
  const res = await request.get('/api/auth/csrf');
  return { 'X-CSRF-Token': ((await res.json()) as { csrfToken: string }).csrfToken };
}

async function signInAsAdmin(page: Page): Promise<void> {
  await signIn(page, ADMIN.email, DEMO_PASSWORD);
  await page.waitForURL('**/admin');
  await page.locator('[data-test="home-admin"]').waitFor();
}

/** A new rider books the first free slot of a listed demo fitter and pays with Stripe's test Visa; returns the payment's id. */
async function paidSession(adminRequest: APIRequestContext): Promise<{ paymentId: number; riderName: string }> {
  const { context, page } = await openPage(session.browser);
  await page.goto('/');
  const riderName = `Ines Refundtest ${randomUUID().slice(0, 4)}`;
  const post = async (path: string, data: unknown) => {
    const res = await page.request.post(path, { data, headers: await csrfHeaders(page.request) });
    expect(res.status(), await res.text()).toBeLessThan(300);
    return (await res.json()) as Record<string, unknown>;
  };
  await post('/api/auth/register', { role: 'rider', displayName: riderName, email: `rider-${randomUUID().slice(0, 8)}@test.example`, password: PASSWORD, timeZone: 'Europe/Dublin' });
  const { currentConsent, questionsToAsk } = await import('@shared/rider');
  await post('/api/rider/intake/submit', {
    symptoms: [{ region: 'knee-front-left', pain: 3, kind: 'ache', timing: ['during-ride'], durationDays: 21 }],
    redFlagAnswers: Object.fromEntries(questionsToAsk({}, []).map((q) => [q, false])),
    goals: ['ride-without-pain'],
    consent: { kind: 'store-health-data', version: currentConsent('store-health-data')!.version, agreed: true },
  });
  const { fitters } = (await (await page.request.get('/api/fitters')).json()) as { fitters: { id: number }[] };
  const day = (offset: number) => new Date(Date.now() + offset * 86_400_000).toISOString().slice(0, 10);
  let slot: { fitterId: number; start: string } | null = null;
  for (const fitter of fitters) {
    const { slots } = (await (await page.request.get(`/api/fitters/${fitter.id}/slots?from=${day(2)}&to=${day(14)}`)).json()) as { slots: { start: string }[] };
    const last = slots.at(-1);
    if (last) {
      slot = { fitterId: fitter.id, start: last.start };
      break;
    }
  }
  expect(slot, 'a listed fitter with a free slot').not.toBeNull();
  const held = (await post('/api/consultations', { fitterId: slot!.fitterId, startsAt: slot!.start })) as { consultation: { id: number } };
  await post(`/api/consultations/${held.consultation.id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() });
  await context.close();
  const { payments } = (await (await adminRequest.get('/api/admin/payments')).json()) as { payments: { id: number; consultationId: number }[] };
  const payment = payments.find((p) => p.consultationId === held.consultation.id);
  expect(payment).toBeDefined();
  return { paymentId: payment!.id, riderName };
}

describe('the Clinic screen', () => {
  it('lets the admin approve a fitter who registered, who can then sign in', async () => {
    const email = `fitter-${randomUUID().slice(0, 8)}@test.example`;
    const applicant = await openPage(session.browser);
    await applicant.page.goto('/');
    const registered = await applicant.page.request.post('/api/auth/register', {
      data: { role: 'fitter', displayName: 'Wren Approvaltest', email, password: PASSWORD, timeZone: 'Europe/Dublin' },
      headers: await csrfHeaders(applicant.page.request),
    });
    expect(registered.status()).toBe(201);
    const id = ((await registered.json()) as { user: { id: number } }).user.id;

    // Not yet: a pending fitter cannot sign in.
    await signIn(applicant.page, email, PASSWORD);
    await applicant.page.locator('[data-test="form-error"]').waitFor();
    expect(applicant.page.url()).toContain('/sign-in');

    const admin = await openPage(session.browser);
    await signInAsAdmin(admin.page);
    await admin.page.locator('[data-test="tab-approvals"]').waitFor();
    await expect(admin.page.locator(`[data-test="pending-${id}"] .pending__name`).innerText()).resolves.toBe('Wren Approvaltest');
    await admin.page.locator(`[data-test="approve-${id}"]`).click();
    await expect(admin.page.locator('.el-message--success').innerText()).resolves.toContain('Wren Approvaltest is approved');
    await admin.page.locator(`[data-test="pending-${id}"]`).waitFor({ state: 'detached' });

    // People lists them as an active fitter.
    await admin.page.locator('[data-test="tab-people"]').click();
    await input(admin.page, 'people-q').fill('Approvaltest');
    await admin.page.locator('[data-test="people-search"]').click();
    await admin.page.locator(`[data-test="user-row-${id}"]`).waitFor();
    await expect(admin.page.locator(`[data-test="user-status-${id}"]`).getAttribute('class')).resolves.toContain('is-checked');
    await admin.context.close();

    await signIn(applicant.page, email, PASSWORD);
    await applicant.page.waitForURL('**/fitter');
    await applicant.page.locator('[data-test="home-fitter"]').waitFor();
    await applicant.context.close();
  });

  it('saves a planner cap inside its hard bound and refuses one outside it', async () => {
    const { context, page } = await openPage(session.browser);
    await signInAsAdmin(page);
    // The stem-length cap: no test's plan moves the stem, so plans built in parallel are not
    // disturbed while it changes. The clinic is put back as it was afterwards.
    const before = (await (await page.request.get('/api/admin/settings')).json()) as { settings: Record<string, unknown> };
    try {
      await page.locator('[data-test="tab-policy"]').click();
      const cap = input(page, 'policy-cap-stemLength');
      await cap.waitFor();
      await expect(page.locator('[data-test="policy-param-stemLength"]').innerText()).resolves.toContain('allowed 5–10 mm');
      await expect(page.locator('[data-test="policy-bounds-note"]').innerText()).resolves.toContain('cannot be changed here');

      const original = Number(await cap.inputValue());
      const next = original === 8 ? 7.5 : 8;
      await cap.fill(String(next));
      await cap.press('Tab');
      await page.locator('[data-test="policy-save"]').click();
      await expect(page.locator('.el-message--success').innerText()).resolves.toContain('Policy saved');

      await page.reload();
      await input(page, 'policy-cap-stemLength').waitFor();
      await expect(input(page, 'policy-cap-stemLength').inputValue()).resolves.toBe(next.toFixed(1));
      expect(page.url()).toContain('tab=policy');

      // Outside the bound: not taken, with the reason beside the field, and nothing is saved.
      await input(page, 'policy-cap-stemLength').fill('15');
      await input(page, 'policy-cap-stemLength').press('Tab');
      const message = page.locator('[data-test="error-planner.stepCaps.stemLength"]');
      await expect(message.innerText()).resolves.toContain('15 is outside the allowed 5–10 mm');
      await page.locator('[data-test="policy-save"]').click();
      await expect(page.locator('[data-test="form-error"]').innerText()).resolves.toContain('outside what is allowed');
      const stored = (await (await page.request.get('/api/admin/settings')).json()) as { settings: { planner: { stepCaps: { stemLength: number } } } };
      expect(stored.settings.planner.stepCaps.stemLength).toBe(next);

      // The server holds the same line for anyone who skips the form.
      const refused = await page.request.put('/api/admin/settings', {
        data: { settings: { ...stored.settings, planner: { ...stored.settings.planner, stepCaps: { ...stored.settings.planner.stepCaps, stemLength: 15 } } } },
        headers: await csrfHeaders(page.request),
      });
      expect(refused.status()).toBe(400);
    } finally {
      const restored = await page.request.put('/api/admin/settings', { data: { settings: before.settings }, headers: await csrfHeaders(page.request) });
      expect(restored.status()).toBe(200);
      await context.close();
    }
  });

  it('shows why the admin cannot switch off their own account', async () => {
    const { context, page } = await openPage(session.browser);
    await signInAsAdmin(page);
    const me = ((await (await page.request.get('/api/auth/me')).json()) as { user: { id: number } }).user.id;
    await page.goto('/admin?tab=people');
    await input(page, 'people-q').fill(ADMIN.email);
    await page.locator('[data-test="people-search"]').click();
    await page.locator(`[data-test="user-row-${me}"]`).waitFor();
    await page.locator(`[data-test="user-status-${me}"]`).click();
    // Disabling asks first; the server then refuses, and the page says why.
    await page.locator('.el-message-box').getByRole('button', { name: 'Disable' }).click();
    await expect(page.locator('[data-test="people-error"]').innerText()).resolves.toContain('your own account');
    await expect(page.locator(`[data-test="user-status-${me}"]`).getAttribute('class')).resolves.toContain('is-checked');
    await context.close();
  });

  it('refunds part of a payment, holds a refund to what is left, and shows the access log read-only', async () => {
    const { context, page } = await openPage(session.browser);
    await signInAsAdmin(page);
    const { paymentId, riderName } = await paidSession(page.request);
    await page.locator('[data-test="tab-payments"]').click();
    await page.locator(`[data-test="payment-${paymentId}"]`).waitFor();
    await page.locator(`[data-test="refund-${paymentId}"]`).click();
    const amount = input(page, 'refund-amount');
    await amount.waitFor();
    const paid = Number(await amount.inputValue());
    expect(paid).toBeGreaterThan(10);
    await page.locator('[data-test="refund-submit"]').click();
    await expect(page.locator('[data-test="error-reason"]').innerText()).resolves.toBe('Say why.');
    await amount.fill('10');
    await input(page, 'refund-reason').fill('Goodwill: the call dropped twice.');
    await page.locator('[data-test="refund-submit"]').click();
    await expect(page.locator('.el-message--success').innerText()).resolves.toContain('now refunded');
    const row = page.locator('.el-table__row', { has: page.locator(`[data-test="payment-${paymentId}"]`) });
    await expect(row.innerText()).resolves.toContain('Partly refunded');
    await expect(row.innerText()).resolves.toContain(riderName);

    // The dialog now offers only what is left; a larger figure is refused, not quietly cut down.
    await page.locator(`[data-test="refund-${paymentId}"]`).click();
    await expect(input(page, 'refund-amount').inputValue()).resolves.toBe((paid - 10).toFixed(2));
    await expect(page.locator('[data-test="refund-submit"]').innerText()).resolves.toMatch(new RegExp(`Refund .*${(paid - 10).toFixed(2)}`));
    await input(page, 'refund-amount').fill('500');
    await input(page, 'refund-reason').fill('A typo');
    await page.locator('[data-test="refund-submit"]').click();
    await expect(page.locator('[data-test="error-amountMinor"]').innerText()).resolves.toMatch(/^At most .* is left to refund\.$/);
    await expect(input(page, 'refund-amount').inputValue()).resolves.toBe('500.00');
    await page.locator('[data-test="refund-dialog"]').getByRole('button', { name: 'Cancel' }).click();
    await expect(row.innerText()).resolves.toContain('Partly refunded');

    await page.locator('[data-test="tab-audit"]').click();
    await page.locator('[data-test="audit-row"]').first().waitFor();
    await expect(page.locator('[data-test="audit-read-only"]').innerText()).resolves.toContain('read-only');
    await page.locator('[data-test="audit-action"]').click();
    await page.keyboard.type('auth.sign_in');
    await page.keyboard.press('Enter');
    await page.locator('[data-test="audit-search"]').click();
    await expect(page.locator('td').getByText('auth.sign_in').first().isVisible()).resolves.toBe(true);
    await context.close();
  });
});
