import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { TEST_PASSWORD } from '../support/factories';
import { caseOnStepOne } from '../support/care-factories';
import { buildFitter, isoDateIn, riderReadyToBook } from '../support/booking-factories';
import { signedInAs } from '../support/factories';
import { randomUUID } from 'node:crypto';
import { openPage, signIn } from '../support/browser';
import { appAndBrowser } from '../support/browser-suite';

/*
 * Phone layout: at 390 × 844 (a common phone) no page may be wider than the screen, so nothing
 * is cut off or needs sideways scrolling. A rider with a plan, a referral and check-ins visits
 * each of their pages; the fitter and physio visit their homes.
 */

const PHONE = { width: 390, height: 844 };

const suite = appAndBrowser();

async function phoneTab(email: string, home: string): Promise<Page> {
  const { page } = await openPage(suite.session.browser, { viewport: PHONE });
  await signIn(page, email, TEST_PASSWORD);
  await page.waitForURL(`**${home}`);
  return page;
}

/** Open a page, wait for its content, then measure how wide the document is. */
async function widthOf(page: Page, path: string, ready: string): Promise<number> {
  await page.goto(path);
  await page.locator(ready).first().waitFor();
  // Charts and lazy sections lay out after their data; give them a moment to settle.
  await page.waitForTimeout(400);
  return page.evaluate(() => document.scrollingElement!.scrollWidth);
}

describe('pages at phone width (390 × 844)', () => {
  it('are no wider than the screen for the rider, the fitter and the physio', async () => {
    const c = await caseOnStepOne(suite.app.app);
    await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, { rides: 3, minutesRidden: 95, comfort: 5, pains: [{ region: 'knee-front-left', pain: 5 }], numbness: false, note: 'A long note from the rider about how the knee felt on the climbs and on the flat, after the change.', redFlagAnswers: {} }).expect(201);
    const referral = await c.fitter.post(`/api/consultations/${c.consultation.id}/referrals`, { urgency: 'routine', reason: 'Pain has not settled after the change.', findings: 'Knee tracks inward at the top of the stroke.', attachmentIds: [], physioId: c.physio.user.id });
    expect(referral.status).toBe(201);

    const rider = await phoneTab(c.rider.user.email, '/rider');
    const pages: [string, string][] = [
      ['/rider', '[data-test="next-action"]'],
      ['/rider/about-me', 'h1'],
      [`/rider/bikes/${c.bikeId}`, 'h1'],
      ['/rider/tell-us-what-hurts', '[data-test="intake-update"]'],
      ['/book', 'h1'],
      ['/plan', '[data-test="my-plan"] [data-test="checkin-trend"]'],
      ['/plan/check-in', '[data-test="checkin-submit"]'],
      [`/referrals/${referral.body.referral.id as number}/consent`, '[data-test="referral-shared"]'],
      ['/rider/data', '[data-test="export-data"]'],
    ];
    const widths: Record<string, number> = {};
    for (const [path, ready] of pages) widths[path] = await widthOf(rider, path, ready);
    // The intake form itself (the page shows the sent answers first).
    await rider.goto('/rider/tell-us-what-hurts');
    await rider.locator('[data-test="intake-update"]').click();
    await rider.locator('[data-test="intake-submit"]').waitFor();
    await rider.waitForTimeout(400);
    widths['intake form'] = await rider.evaluate(() => document.scrollingElement!.scrollWidth);

    const fitter = await phoneTab(c.fitter.user.email, '/fitter');
    widths['/fitter'] = await widthOf(fitter, '/fitter', '[data-test="home-fitter"] h2');
    const physio = await phoneTab(c.physio.user.email, '/physio');
    widths['/physio'] = await widthOf(physio, '/physio', '[data-test="home-physio"] h2');

    const tooWide = Object.entries(widths).filter(([, width]) => width > PHONE.width);
    expect(tooWide, JSON.stringify(widths)).toEqual([]);
  });

  it("shows the clinic's payments and people as stacked rows, each with its controls on screen", async () => {
    const { fitter } = await buildFitter();
    const rider = await riderReadyToBook(suite.app.app);
    const held = await rider.post('/api/consultations', { fitterId: fitter.id, startsAt: `${isoDateIn(5)}T11:00:00Z` }).expect(201);
    const paid = await rider.post(`/api/consultations/${held.body.consultation.id as number}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(200);
    expect(paid.body.consultation.payment.status).toBe('succeeded');
    const admin = await signedInAs(suite.app.app, 'admin');
    const { payments } = (await admin.get('/api/admin/payments').expect(200)).body as { payments: { id: number; consultationId: number }[] };
    const payment = payments.find((p) => p.consultationId === held.body.consultation.id)!;

    const page = await phoneTab(admin.user.email, '/admin');
    const width = await widthOf(page, '/admin?tab=payments', `[data-test="refund-${payment.id}"]`);
    expect(width).toBeLessThanOrEqual(PHONE.width);
    const button = (await page.locator(`[data-test="refund-${payment.id}"]`).boundingBox())!;
    expect(button.x + button.width).toBeLessThanOrEqual(PHONE.width);

    // The people list stacks too: the admin's own role and sign-in switch are on screen.
    await page.goto('/admin?tab=people');
    await page.locator('input[data-test="people-q"], [data-test="people-q"] input').first().fill(admin.user.email);
    await page.locator('[data-test="people-search"]').click();
    await page.locator(`[data-test="user-row-${admin.user.id}"]`).waitFor();
    expect(await page.evaluate(() => document.scrollingElement!.scrollWidth)).toBeLessThanOrEqual(PHONE.width);
    for (const control of [`user-role-${admin.user.id}`, `user-status-${admin.user.id}`]) {
      const box = (await page.locator(`[data-test="${control}"]`).boundingBox())!;
      expect(box.x + box.width, control).toBeLessThanOrEqual(PHONE.width);
    }
  });
});
