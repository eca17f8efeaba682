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
const input = (page: Page, test: string) => page.locator(`[data-test="${test}"] input, input[data-test="${test}"]`).first();

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
    // Put the clinic back as it was afterwards: later browser tests plan with these caps.
    const before = (await (await page.request.get('/api/admin/settings')).json()) as { settings: Record<string, unknown> };
    try {
      await page.locator('[data-test="tab-policy"]').click();
      const cap = input(page, 'policy-cap-saddleHeight');
      await cap.waitFor();
      await expect(page.locator('[data-test="policy-param-saddleHeight"]').innerText()).resolves.toContain('allowed 1–5 mm');
      await expect(page.locator('[data-test="policy-bounds-note"]').innerText()).resolves.toContain('cannot be changed here');

      const original = Number(await cap.inputValue());
      const next = original === 4 ? 3.5 : 4;
      await cap.fill(String(next));
      await cap.press('Tab');
      await page.locator('[data-test="policy-save"]').click();
      await expect(page.locator('.el-message--success').innerText()).resolves.toContain('Policy saved');

      await page.reload();
      await input(page, 'policy-cap-saddleHeight').waitFor();
      await expect(input(page, 'policy-cap-saddleHeight').inputValue()).resolves.toBe(next.toFixed(1));
      expect(page.url()).toContain('tab=policy');

      // Outside the bound: not taken, with the reason beside the field, and nothing is saved.
      await input(page, 'policy-cap-saddleHeight').fill('9');
      await input(page, 'policy-cap-saddleHeight').press('Tab');
      const message = page.locator('[data-test="error-planner.stepCaps.saddleHeight"]');
      await expect(message.innerText()).resolves.toContain('9 is outside the allowed 1–5 mm');
      await page.locator('[data-test="policy-save"]').click();
      await expect(page.locator('[data-test="form-error"]').innerText()).resolves.toContain('outside what is allowed');
      const stored = (await (await page.request.get('/api/admin/settings')).json()) as { settings: { planner: { stepCaps: { saddleHeight: number } } } };
      expect(stored.settings.planner.stepCaps.saddleHeight).toBe(next);

      // The server holds the same line for anyone who skips the form.
      const refused = await page.request.put('/api/admin/settings', {
        data: { settings: { ...stored.settings, planner: { ...stored.settings.planner, stepCaps: { ...stored.settings.planner.stepCaps, saddleHeight: 9 } } } },
        headers: await csrfHeaders(page.request),
      });
      expect(refused.status()).toBe(400);
    } finally {
      const restored = await page.request.put('/api/admin/settings', { data: { settings: before.settings }, headers: await csrfHeaders(page.request) });
      expect(restored.status()).toBe(200);
      await context.close();
    }
  });
});
