import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import sharp from 'sharp';
import type { Page } from 'playwright-core';
import { launchBrowser, openPage, type BrowserSession } from '../support/browser';

let session: BrowserSession;
beforeAll(async () => {
  session = await launchBrowser();
});
afterAll(async () => {
  await session?.close();
});

const input = (page: Page, test: string) => page.locator(`[data-test="${test}"] input, input[data-test="${test}"]`).first();

/** A new rider registers and lands on My fit. */
async function registerRider(page: Page, name: string) {
  await page.goto('/register');
  await page.locator('[data-test="role-rider"]').click();
  await input(page, 'display-name').fill(name);
  await input(page, 'email').fill(`${name.split(' ')[0]!.toLowerCase()}-${randomUUID().slice(0, 8)}@test.example`);
  await input(page, 'password').fill('a-long-enough-password');
  await page.locator('[data-test="submit"]').click();
  await page.waitForURL('**/rider');
}

async function openIntake(page: Page) {
  await page.locator('[data-test="next-action-go"]').click();
  await page.waitForURL('**/rider/tell-us-what-hurts');
  await page.locator('[data-test="body-view"]').waitFor();
}

async function answerAllNo(page: Page) {
  const noButtons = page.locator('[data-test^="flag-"][data-test$="-no"]');
  const count = await noButtons.count();
  expect(count).toBeGreaterThan(5);
  for (let i = 0; i < count; i += 1) await noButtons.nth(i).click();
}

describe('Tell us what hurts, in the browser', () => {
  it('records a sore knee on the body map, shows the triage at once and uploads a photo with progress', async () => {
    const { context, page } = await openPage(session.browser, { viewport: { width: 390, height: 844 } });
    await registerRider(page, 'Imogen Testrider');
    await openIntake(page);

    // The body map works with a pointer…
    const knee = page.locator('[data-test="region-knee-front-left"]');
    await knee.click();
    await expect(knee.getAttribute('aria-checked')).resolves.toBe('true');
    await page.locator('[data-test="symptom-knee-front-left"]').waitFor();
    // …and with the keyboard: Space marks a region, Enter unmarks it.
    const other = page.locator('[data-test="region-knee-front-right"]');
    await other.focus();
    await page.keyboard.press('Space');
    await page.locator('[data-test="symptom-knee-front-right"]').waitFor();
    await other.focus();
    await page.keyboard.press('Enter');
    await page.locator('[data-test="symptom-knee-front-right"]').waitFor({ state: 'detached' });

    await page.locator('[data-test="pain-knee-front-left-4"]').click();
    await page.locator('[data-test="kind-knee-front-left-ache"]').click();
    await page.locator('[data-test="timing-knee-front-left-during-ride"]').click();
    await page.locator('[data-test="duration-knee-front-left-21"]').click();
    await answerAllNo(page);
    await page.locator('[data-test="goal-ride-without-pain"]').click();
    await page.locator('[data-test="consent"]').click();
    await page.locator('[data-test="intake-submit"]').click();

    const result = page.locator('[data-test="triage-result"]');
    await result.waitFor();
    await expect(result.getAttribute('data-level')).resolves.toBe('none');
    await expect(page.locator('[data-test="urgent-notice"]').count()).resolves.toBe(0);
    await expect(page.locator('[data-test="booking-readiness"]').getAttribute('data-ready')).resolves.toBe('yes');
    await expect(page.locator('[data-test="intake-cautions"]').first().innerText()).resolves.toContain('does not diagnose');

    const png = await sharp({ create: { width: 48, height: 32, channels: 3, background: '#1f4d45' } }).png().toBuffer();
    await page.locator('[data-test="upload-view-side-crank-3"]').click();
    await page.locator('[data-test="upload-input"]').setInputFiles({ name: 'side-on.png', mimeType: 'image/png', buffer: png });
    await page.locator('[data-test="upload-progress"][data-status="done"]').waitFor();
    await expect(page.locator('[data-test="upload-status"]').first().innerText()).resolves.toBe('Done');
    await page.locator('[data-test="uploads-saved"] img').first().waitFor();
    await context.close();
  });

  it('stops a rider with an urgent red flag: the stop-riding notice, and booking blocked', async () => {
    const { context, page } = await openPage(session.browser);
    await registerRider(page, 'Julian Testrider');
    await openIntake(page);

    await answerAllNo(page);
    await page.locator('[data-test="flag-bladder-bowel-change-yes"]').click();
    await page.locator('[data-test="goal-ride-without-pain"]').click();
    await page.locator('[data-test="consent"]').click();
    await page.locator('[data-test="intake-submit"]').click();

    const notice = page.locator('[data-test="urgent-notice"]');
    await notice.waitFor();
    await expect(notice.innerText()).resolves.toMatch(/stop riding/i);
    await expect(page.locator('[data-test="triage-result"]').getAttribute('data-level')).resolves.toBe('urgent');
    const readiness = page.locator('[data-test="booking-readiness"]');
    await expect(readiness.getAttribute('data-ready')).resolves.toBe('no');
    await expect(readiness.innerText()).resolves.toMatch(/Booking is not open yet/);
    await expect(page.locator('[data-test="go-book"]').count()).resolves.toBe(0);

    // My fit says the same, first thing.
    await page.goto('/rider');
    const home = page.locator('[data-test="home-readiness"]');
    await home.waitFor();
    await expect(home.getAttribute('data-code')).resolves.toBe('urgent');
    await expect(page.locator('[data-test="home-urgent"]').innerText()).resolves.toMatch(/stop riding and get urgent medical care today/);
    // and "My sessions" offers no way to book meanwhile.
    await page.locator('[data-test="booking-paused"]').waitFor();
    await expect(page.locator('[data-test="book-session"]').count()).resolves.toBe(0);
    await context.close();
  });

  it('lets the rider retry an upload the network dropped, and refuses a renamed file with its reason', async () => {
    const { context, page } = await openPage(session.browser);
    await registerRider(page, 'Lena Testrider');
    await openIntake(page);
    const png = await sharp({ create: { width: 24, height: 24, channels: 3, background: '#c8643b' } }).png().toBuffer();

    // The first attempt is cut off before it reaches the server.
    let dropped = false;
    await page.route('**/api/rider/uploads', async (route) => {
      if (route.request().method() === 'POST' && !dropped) {
        dropped = true;
        await route.abort('connectionreset');
      } else {
        await route.continue();
      }
    });
    await page.locator('[data-test="upload-input"]').setInputFiles({ name: 'front.png', mimeType: 'image/png', buffer: png });
    const row = page.locator('[data-test="upload-row"]').first();
    await page.locator('[data-test="upload-row"][data-state="failed"]').waitFor();
    await expect(row.locator('[data-test="upload-status"]').innerText()).resolves.toMatch(/could not reach Saddlestep/);
    await row.locator('[data-test="upload-retry"]').click();
    await page.locator('[data-test="upload-row"][data-state="done"]').waitFor();

    // A text file dressed up as a photo is refused by its content, and retrying would not help.
    await page.locator('[data-test="upload-input"]').setInputFiles({ name: 'holiday.png', mimeType: 'image/png', buffer: Buffer.from('not really a picture, just words\n'.repeat(10)) });
    const refused = page.locator('[data-test="upload-row"][data-state="failed"]');
    await refused.waitFor();
    await expect(refused.locator('[data-test="upload-status"]').innerText()).resolves.toMatch(/whatever its name or type says/);
    await expect(refused.locator('[data-test="upload-retry"]').count()).resolves.toBe(0);
    // A PDF renamed .jpg is refused the same way, and its row shows a plain placeholder, never a broken picture.
    await page.locator('[data-test="upload-input"]').setInputFiles({ name: 'bike.jpg', mimeType: 'image/jpeg', buffer: Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\n%%EOF\n') });
    await expect.poll(() => refused.count()).toBe(2);
    for (const row of await refused.all()) {
      await expect(row.locator('[data-test="upload-thumb"]').count()).resolves.toBe(0);
      await expect(row.locator('[data-test="upload-thumb-placeholder"]').count()).resolves.toBe(1);
    }

    // A real photo with no declared type (as some phones hand them over) goes to the server, which reads its content.
    const jpeg = await sharp({ create: { width: 24, height: 24, channels: 3, background: '#3b8c6e' } }).jpeg().toBuffer();
    await page.locator('[data-test="upload-input"]').setInputFiles({ name: 'IMG_0001', mimeType: '', buffer: jpeg });
    await page.locator('[data-test="upload-row"][data-state="done"]').nth(1).waitFor();
    await context.close();
  });

  it('keeps a draft: half an answer saved, then resumed after a reload', async () => {
    const { context, page } = await openPage(session.browser);
    await registerRider(page, 'Kemal Testrider');
    await openIntake(page);
    await page.locator('[data-test="region-hip-left"]').click();
    await page.locator('[data-test="pain-hip-left-3"]').click();
    await page.locator('[data-test="intake-save-draft"]').click();
    await page.locator('[data-test="draft-saved"]').waitFor();
    await page.reload();
    await page.locator('[data-test="symptom-hip-left"]').waitFor();
    await expect(page.locator('[data-test="pain-hip-left-3"] input').isChecked()).resolves.toBe(true);
    // My fit acknowledges the draft and leads back to it, rather than offering to start again.
    await page.goto('/rider');
    const next = page.locator('[data-test="next-action"][data-kind="continue_intake"]');
    await next.waitFor();
    await expect(next.innerText()).resolves.not.toMatch(/ten minutes|Start: tell us/);
    await next.locator('[data-test="next-action-go"]').click();
    await page.locator('[data-test="symptom-hip-left"]').waitFor();
    await context.close();
  });
});
