import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { DEMO_PASSWORD, DEMO_PEOPLE } from '@server/seed/demo-people';
import { launchBrowser, openPage, signIn, testBaseUrl, type BrowserSession } from '../support/browser';

let session: BrowserSession;
beforeAll(async () => {
  session = await launchBrowser();
});
afterAll(async () => {
  await session?.close();
});

const HOME_PATH = { rider: '/rider', fitter: '/fitter', physio: '/physio', admin: '/admin' } as const;

describe('registration and sign-in in the browser', () => {
  it('registers a new rider who lands on the rider home', async () => {
    const { context, page } = await openPage(session.browser, { viewport: { width: 390, height: 844 } });
    await page.goto('/register');
    await page.locator('[data-test="role-rider"]').click();
    await page.locator('[data-test="display-name"] input, input[data-test="display-name"]').first().fill('Quinn Newrider');
    await page.locator('[data-test="email"] input, input[data-test="email"]').first().fill(`quinn-${randomUUID().slice(0, 8)}@test.example`);
    await page.locator('[data-test="password"] input, input[data-test="password"]').first().fill('a-long-enough-password');
    await page.locator('[data-test="submit"]').click();
    await page.waitForURL('**/rider');
    await expect(page.locator('[data-test="home-rider"]').isVisible()).resolves.toBe(true);

    // A rider who moved changes their zone and name from the top bar's account link.
    await page.locator('[data-test="account-link"]').click();
    await page.waitForURL('**/account');
    await page.locator('[data-test="account-name"] input, input[data-test="account-name"]').first().fill('Quinn Moved');
    await page.locator('[data-test="account-zone"]').click();
    await page.keyboard.type('Tokyo');
    await page.locator('.el-select-dropdown__item:visible', { hasText: 'Asia/Tokyo' }).first().click();
    await page.locator('[data-test="account-save"]').click();
    await page.locator('[data-test="user-name"]', { hasText: 'Quinn Moved' }).waitFor();
    await page.reload();
    await expect(page.locator('[data-test="account-zone"]').innerText()).resolves.toMatch(/Asia\/Tokyo/);
    await context.close();
  });

  for (const person of DEMO_PEOPLE.filter((p, i, all) => all.findIndex((q) => q.role === p.role) === i)) {
    it(`signs in the demo ${person.role} and shows the ${person.role} home`, async () => {
      const { context, page } = await openPage(session.browser);
      await signIn(page, person.email, DEMO_PASSWORD);
      await page.waitForURL(`**${HOME_PATH[person.role]}`);
      await page.locator(`[data-test="home-${person.role}"]`).waitFor();
      await expect(page.getByText(person.displayName).first().isVisible()).resolves.toBe(true);
      await context.close();
    });
  }

  it('shows the sign-in failure message for a wrong password', async () => {
    const { context, page } = await openPage(session.browser);
    await signIn(page, DEMO_PEOPLE[0]!.email, 'definitely-not-it');
    const alert = page.locator('[data-test="form-error"]');
    await alert.waitFor();
    await expect(alert.innerText()).resolves.toContain('That e-mail and password do not match an account.');
    expect(page.url()).toContain('/sign-in');
    await context.close();
  });

  it('turns a rider away from a fitter page', async () => {
    const rider = DEMO_PEOPLE.find((p) => p.role === 'rider')!;
    const { context, page } = await openPage(session.browser);
    await signIn(page, rider.email, DEMO_PASSWORD);
    await page.waitForURL('**/rider');
    await page.goto('/fitter');
    await page.locator('[data-test="wrong-role-notice"]').waitFor();
    expect(new URL(page.url()).pathname).toBe('/rider');
    await expect(page.locator('[data-test="home-fitter"]').count()).resolves.toBe(0);
    await context.close();
  });

  it('sends a signed-out visitor from a guarded page to sign in', async () => {
    const { context, page } = await openPage(session.browser);
    await page.goto('/admin');
    await page.waitForURL('**/sign-in**');
    await context.close();
  });

  it('makes no request to any other origin', async () => {
    const { context, page, requests } = await openPage(session.browser);
    const origin = new URL(testBaseUrl()).origin;
    await page.goto('/');
    await page.waitForLoadState('networkidle');
    await signIn(page, DEMO_PEOPLE.find((p) => p.role === 'admin')!.email, DEMO_PASSWORD);
    await page.waitForURL('**/admin');
    await page.waitForLoadState('networkidle');
    expect(requests.length).toBeGreaterThan(3);
    const foreign = requests.filter((url) => !url.startsWith(origin) && !url.startsWith('data:') && !url.startsWith('blob:'));
    expect(foreign).toEqual([]);
    // The Lato font is served from our own origin.
    expect(requests.some((url) => /lato.*\.woff2?$/i.test(url))).toBe(true);
    await context.close();
  });
});
