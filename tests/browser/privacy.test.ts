import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import type { Page } from 'playwright-core';
import AdmZip from 'adm-zip';
import { launchBrowser, openPage, signIn, type BrowserSession } from '../support/browser';

/* "Your data" in the browser: a rider downloads their export, then deletes their account. */

const PASSWORD = 'a-long-enough-password';
const input = (page: Page, test: string) => page.locator(`[data-test="${test}"] input, input[data-test="${test}"]`).first();

let session: BrowserSession;
beforeAll(async () => {
  session = await launchBrowser();
});
afterAll(async () => {
  await session?.close();
});

describe('Your data', () => {
  it('downloads the export and then deletes the account after the password and DELETE', async () => {
    const { context, page } = await openPage(session.browser, { viewport: { width: 390, height: 844 } });
    const email = `leaver-${randomUUID().slice(0, 8)}@test.example`;
    await page.goto('/register');
    await page.locator('[data-test="role-rider"]').click();
    await input(page, 'display-name').fill('Pia Leavetest');
    await input(page, 'email').fill(email);
    await input(page, 'password').fill(PASSWORD);
    await page.locator('[data-test="submit"]').click();
    await page.waitForURL('**/rider');

    // Reached from About me (and the footer).
    await page.goto('/rider/about-me');
    await page.locator('[data-test="link-my-data"]').click();
    await page.waitForURL('**/rider/data');

    const [download] = await Promise.all([page.waitForEvent('download'), page.locator('[data-test="export-data"]').click()]);
    expect(download.suggestedFilename()).toMatch(/\.zip$/);
    const zip = new AdmZip(await download.path());
    const data = JSON.parse(zip.readAsText('data.json')) as unknown;
    expect(JSON.stringify(data)).toContain('Pia Leavetest');

    // Both checks first: without DELETE, then with a wrong password.
    await input(page, 'delete-password').fill(PASSWORD);
    await input(page, 'delete-confirm').fill('delete');
    await page.locator('[data-test="delete-account"]').click();
    await expect(page.locator('[data-test="error-confirm"]').innerText()).resolves.toBe('Type DELETE to confirm.');
    await input(page, 'delete-confirm').fill('DELETE');
    await input(page, 'delete-password').fill('not-my-password');
    await page.locator('[data-test="delete-account"]').click();
    await expect(page.locator('[data-test="error-password"]').innerText()).resolves.toBe('That password is not right.');

    await input(page, 'delete-password').fill(PASSWORD);
    await page.locator('[data-test="delete-account"]').click();
    await page.locator('[data-test="account-deleted-notice"]').waitFor();
    expect(new URL(page.url()).pathname).toBe('/');
    await expect(page.locator('[data-test="user-name"]').count()).resolves.toBe(0);

    await signIn(page, email, PASSWORD);
    await page.locator('[data-test="form-error"]').waitFor();
    expect(page.url()).toContain('/sign-in');
    await context.close();
  });
});
