import { describe, expect, it } from 'vitest';
import sharp from 'sharp';
import type { BrowserContext, Dialog, Page } from 'playwright-core';
import { DEMO_PHOTO_SVG } from '@server/seed/demo-photo';
import { TEST_PASSWORD } from '../support/factories';
import { caseWithBike, TEST_SETUP } from '../support/plan-factories';
import { startingSoon } from '../support/chat-factories';
import { openPage, signIn } from '../support/browser';
import { appAndBrowser } from '../support/browser-suite';

/*
 * The session room in the browser: the fitter measures a photo, builds and sends a plan, the
 * rider makes step 1 on My plan, and chat text always stays text. Every test makes its own rider,
 * fitter, bike, photo and booked consultation through the real app (the launcher's server shares
 * the database and the upload folder).
 */

const PHONE = { width: 390, height: 844 };
const WIDE = { width: 1440, height: 960 };

const suite = appAndBrowser();

/** A booked case: intake, profile with inseam, a bike with its baseline, and the demo side-on photo. */
async function bookedCase() {
  const c = await caseWithBike(suite.app.app);
  await c.rider.put('/api/rider/profile', { unit: 'mm', inseam: 860, height: 1780 }).expect(200);
  const photo = await sharp(Buffer.from(DEMO_PHOTO_SVG)).jpeg({ quality: 85 }).toBuffer();
  const uploaded = await c.rider.agent
    .post('/api/rider/uploads')
    .set('X-CSRF-Token', c.rider.csrfToken)
    .field('view', 'side-crank-6')
    .attach('file', photo, { filename: 'side.jpg', contentType: 'image/jpeg' });
  expect(uploaded.status, JSON.stringify(uploaded.body)).toBe(201);
  return { ...c, uploadId: uploaded.body.upload.id as number };
}
type Case = Awaited<ReturnType<typeof bookedCase>>;

async function signedInTab(email: string, home: string, viewport = WIDE): Promise<{ context: BrowserContext; page: Page }> {
  const { context, page } = await openPage(suite.session.browser, { viewport });
  await signIn(page, email, TEST_PASSWORD);
  await page.waitForURL(`**${home}`);
  return { context, page };
}

async function openRoom(page: Page, c: Case, tab?: string): Promise<void> {
  await page.goto(`/consultations/${c.consultation.id}/room${tab ? `?tab=${tab}` : ''}`);
  await page.locator('[data-test="session-room"]').waitFor();
}

/** 180° minus the angle at b, for points in screen pixels (the photo is scaled evenly, so angles carry over). */
function kneeFlexion(a: { x: number; y: number }, b: { x: number; y: number }, c: { x: number; y: number }): number {
  const u = { x: a.x - b.x, y: a.y - b.y };
  const v = { x: c.x - b.x, y: c.y - b.y };
  const cos = (u.x * v.x + u.y * v.y) / (Math.hypot(u.x, u.y) * Math.hypot(v.x, v.y));
  return 180 - (Math.acos(cos) * 180) / Math.PI;
}

describe('the session room in the browser', () => {
  it('lets a fitter open a booked session, mark hip, knee and ankle on a photo and read the knee angle', async () => {
    const c = await bookedCase();
    const { context, page } = await signedInTab(c.fitter.user.email, '/fitter');
    await openRoom(page, c);
    await page.locator('[data-test="case-red-flags"]').waitFor();
    await expect(page.locator('[data-test="case-causes"]').innerText()).resolves.toContain('Possible fit causes to check');
    // Days ahead, the session cannot be started yet; a few minutes before its time it can.
    expect(await page.locator('[data-test="start-session"]').isDisabled()).toBe(true);
    await expect(page.locator('[data-test="start-opens"]').innerText()).resolves.toMatch(/15 minutes before the booked time/);
    await startingSoon(c.consultation);
    await page.reload();
    await page.locator('[data-test="start-session"]:not([disabled])').waitFor();
    await page.locator('[data-test="start-session"]').click();
    await expect.poll(() => page.locator('[data-test="room-status"]').getAttribute('data-status')).toBe('in_session');

    await page.locator(`[data-test="case-measure-${c.uploadId}"]`).click();
    const photo = page.locator(`[data-test="measure-photo-${c.uploadId}"]`);
    await photo.waitFor();
    // Hip is armed first; each click places the armed point and arms the next.
    const box = (await photo.boundingBox())!;
    const at = (fx: number, fy: number) => ({ x: Math.round(box.width * fx), y: Math.round(box.height * fy) });
    const hip = at(0.3, 0.25);
    const knee = at(0.55, 0.5);
    const ankle = at(0.5, 0.85);
    for (const p of [hip, knee, ankle]) await photo.click({ position: p });
    for (const name of ['hip', 'knee', 'ankle']) await page.locator(`[data-test="handle-${name}"]`).waitFor();

    const shown = page.locator('[data-test="knee-flexion"]');
    await shown.waitFor();
    const value = Number.parseFloat(await shown.innerText());
    expect(Math.abs(value - kneeFlexion(hip, knee, ankle))).toBeLessThan(1);

    // Keyboard: Tab to the knee handle and nudge it 10 px; the angle changes at once.
    await page.locator('[data-test="handle-knee"]').focus();
    await page.keyboard.press('Shift+ArrowRight');
    await expect.poll(async () => Number.parseFloat(await shown.innerText())).not.toBe(value);

    // Knee front and pedal spindle come next in the marking order; the optional bottom bracket,
    // marked well below the spindle's level, shows the crank-level warning (cranks not level).
    await photo.click({ position: at(0.62, 0.5) });
    await photo.click({ position: at(0.6, 0.8) });
    await page.locator('[data-test="handle-spindle"]').waitFor();
    expect(await page.locator('[data-test="crank-level-warning"]').count()).toBe(0);
    await page.locator('[data-test="mark-bottom-bracket"]').click();
    await photo.click({ position: at(0.45, 0.95) });
    await page.locator('[data-test="crank-line"]').waitFor();
    await expect(page.locator('[data-test="crank-level-warning"]').innerText()).resolves.toMatch(/from level/);

    await page.locator('[data-test="save-measurement"]').click();
    await page.locator('[data-test="measurement-saved"]').waitFor();
    const nudged = await shown.innerText();

    // Reopening the photo brings back the saved marks.
    await page.reload();
    await page.locator('[data-test="handle-knee"]').waitFor();
    await expect(page.locator('[data-test="knee-flexion"]').innerText()).resolves.toBe(nudged);
    await context.close();
  });

  it('sends a plan from the plan builder; the rider sees step 1 on My plan and marks it made', async () => {
    const c = await bookedCase();
    // A plan is sent once the session has started (shared/plan/send-rule.ts).
    await startingSoon(c.consultation);
    await c.fitter.post(`/api/consultations/${c.consultation.id}/start`).expect(200);
    const fitterTab = await signedInTab(c.fitter.user.email, '/fitter');
    const fitter = fitterTab.page;
    await openRoom(fitter, c, 'plan');
    const saddle = fitter.locator('[data-test="plan-target-saddleHeight"] input');
    await saddle.waitFor();
    await saddle.fill(String(TEST_SETUP.saddleHeight + 5));
    await saddle.blur();
    const preview = fitter.locator('[data-test="plan-preview"]');
    // 5 mm at 3 mm per step: two steps, the first +3 mm.
    await expect.poll(() => preview.getAttribute('data-steps')).toBe('2');
    await expect(fitter.locator('[data-test="preview-step-1"]').innerText()).resolves.toContain('+3 mm');
    await fitter.locator('[data-test="send-plan"]').click();
    await fitter.locator('[data-test="plan-sent"]').waitFor();
    await expect.poll(() => fitter.locator('[data-test="room-status"]').getAttribute('data-status')).toBe('plan_active');

    const { context, page } = await signedInTab(c.rider.user.email, '/rider', PHONE);
    await page.locator('[data-test="open-my-plan"]').click();
    await page.waitForURL('**/plan');
    const card = page.locator('[data-test="plan-step-current"]');
    await card.waitFor();
    await expect(card.getAttribute('data-index')).resolves.toBe('1');
    await expect(card.innerText()).resolves.toContain('+3 mm');
    await expect(page.locator('[data-test="step-1-state"]').getAttribute('data-state')).resolves.toBe('current');
    await expect(page.locator('[data-test="plan-step-diagram"]').first().getAttribute('data-parameter')).resolves.toBe('saddleHeight');

    await expect(page.locator('[data-test="applied-on"]').inputValue()).resolves.toMatch(/^\d{4}-\d{2}-\d{2}$/);
    await page.locator('[data-test="apply-step"]').click();
    await expect.poll(() => page.locator('[data-test="step-1-state"]').getAttribute('data-state')).toBe('applied');
    await expect(page.locator('[data-test="step-2-state"]').getAttribute('data-state')).resolves.toBe('current');

    // The plan also arrived in the chat as a card.
    await page.goto(`/consultations/${c.consultation.id}/room`);
    await expect(page.locator('[data-test="plan-card"]').first().innerText()).resolves.toContain('2 steps');
    await context.close();
    await fitterTab.context.close();
  });

  it('shows markup typed into the chat as text, live on the other side, with its delivery state', async () => {
    const c = await bookedCase();
    const dialogs: string[] = [];
    const rider = await signedInTab(c.rider.user.email, '/rider', PHONE);
    const fitter = await signedInTab(c.fitter.user.email, '/fitter');
    for (const page of [rider.page, fitter.page]) page.on('dialog', (d: Dialog) => void d.dismiss().then(() => dialogs.push(d.message())));
    await openRoom(fitter.page, c);
    await openRoom(rider.page, c);
    await rider.page.locator('[data-test="presence"][data-online="yes"]').waitFor();

    const text = '<img src=x onerror=alert(1)>';
    await rider.page.locator('textarea[data-test="chat-input"]').fill(text);
    await rider.page.locator('[data-test="chat-send"]').click();

    for (const page of [rider.page, fitter.page]) {
      const body = page.locator('[data-test="chat-thread"] [data-test="message-body"]').last();
      await body.waitFor();
      await expect(body.innerText()).resolves.toBe(text);
      await expect(page.locator('[data-test="chat-thread"] img[src="x"]').count()).resolves.toBe(0);
    }
    // The fitter has the thread open, so the rider sees it read.
    await expect.poll(() => rider.page.locator('[data-test="message-state"]').last().getAttribute('data-state')).toBe('read');
    expect(dialogs).toEqual([]);
    await rider.context.close();
    await fitter.context.close();
  });

  it('keeps a message written offline and sends it once when the connection is back', async () => {
    const c = await bookedCase();
    const rider = await signedInTab(c.rider.user.email, '/rider', PHONE);
    const fitter = await signedInTab(c.fitter.user.email, '/fitter');
    await openRoom(fitter.page, c);
    await openRoom(rider.page, c);
    await rider.page.locator('[data-test="presence"][data-online="yes"]').waitFor();

    await rider.context.setOffline(true);
    await rider.page.locator('[data-test="chat-offline"]').waitFor();
    const text = `Written on the train ${Date.now()}`;
    await rider.page.locator('textarea[data-test="chat-input"]').fill(text);
    await rider.page.locator('[data-test="chat-send"]').click();
    await expect(rider.page.locator('[data-test="message-state"]').last().getAttribute('data-state')).resolves.toBe('sending');

    await rider.context.setOffline(false);
    await expect.poll(() => rider.page.locator('[data-test="message-state"]').last().getAttribute('data-state'), { timeout: 20_000 }).not.toBe('sending');
    const onFitterSide = fitter.page.locator('[data-test="chat-thread"] [data-test="message-body"]', { hasText: text });
    await onFitterSide.first().waitFor();
    // After a reload both sides still have it exactly once.
    await rider.page.reload();
    await rider.page.locator('[data-test="chat-thread"] [data-test="message-body"]', { hasText: text }).first().waitFor();
    await expect(rider.page.locator('[data-test="chat-thread"] [data-test="message-body"]', { hasText: text }).count()).resolves.toBe(1);
    await expect(onFitterSide.count()).resolves.toBe(1);
    await rider.context.close();
    await fitter.context.close();
  });
});
