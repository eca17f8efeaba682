import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import type { APIRequestContext, Page } from 'playwright-core';
import type { Setup } from '@shared/fit/setup';
import { launchBrowser, openPage, type BrowserSession } from '../support/browser';
import { roadSetup, today } from '../support/rider-factories';

/**
 * Inches on screen, millimetres in storage: a rider who views inches and saves without editing
 * must leave every stored millimetre exactly as it was, and a number typed in inches must store
 * its exact conversion.
 */
let session: BrowserSession;
beforeAll(async () => {
  session = await launchBrowser();
});
afterAll(async () => {
  await session?.close();
});

// Values whose inch display (to 0.01 in) rounds away from the stored millimetres.
const STORED: Setup = roadSetup({ saddleHeight: 720, saddleSetback: 60, reach: 520, drop: 100, stemLength: 100, spacerStack: 20, stack: 20 });

async function csrf(request: APIRequestContext): Promise<Record<string, string>> {
  const res = await request.get('/api/auth/csrf');
  return { 'X-CSRF-Token': ((await res.json()) as { csrfToken: string }).csrfToken };
}

async function send(page: Page, method: 'post' | 'put', path: string, data: unknown): Promise<Record<string, unknown>> {
  const res = await page.request[method](path, { data, headers: await csrf(page.request) });
  expect(res.status(), await res.text()).toBeLessThan(300);
  return (await res.json()) as Record<string, unknown>;
}

async function getJson<T>(page: Page, path: string): Promise<T> {
  const res = await page.request.get(path);
  expect(res.status()).toBe(200);
  return (await res.json()) as T;
}

/** A new rider with a profile and one bike, both entered in millimetres. */
async function riderWithBike(page: Page): Promise<number> {
  await page.goto('/');
  await send(page, 'post', '/api/auth/register', {
    role: 'rider', displayName: 'Ulla Unittest', email: `units-${randomUUID().slice(0, 8)}@test.example`, password: 'a-long-enough-password', timeZone: 'Europe/Dublin',
  });
  await send(page, 'put', '/api/rider/profile', { unit: 'mm', height: 1750, inseam: 820 });
  const { bike } = (await send(page, 'post', '/api/rider/bikes', { name: 'Inch test bike', kind: 'road', baseline: { unit: 'mm', setup: STORED, takenOn: today() } })) as { bike: { id: number } };
  return bike.id;
}

type BikeHistory = { snapshots: { setup: Setup }[] };
const box = (page: Page, name: string) => page.locator(`[data-test="measure-${name}"] input`);

describe('mm and inches in the browser', () => {
  it('saves an untouched measurement in inches with every stored millimetre unchanged, and stores a typed inch value exactly', async () => {
    const { context, page } = await openPage(session.browser);
    const bikeId = await riderWithBike(page);
    await page.goto(`/rider/bikes/${bikeId}`);
    await page.locator('[data-test="unit-in"]').click();
    await page.locator('[data-test="current-saddleHeight"]').getByText('28.35 in').waitFor();

    await page.locator('[data-test="measure-again"]').click();
    await expect(box(page, 'saddleHeight').inputValue()).resolves.toBe('28.35');
    // Switching unit back and forth on the open form must not move anything either.
    await page.locator('[data-test="unit-mm"]').click();
    await expect(box(page, 'saddleHeight').inputValue()).resolves.toBe('720');
    await page.locator('[data-test="unit-in"]').click();
    await expect(box(page, 'saddleSetback').inputValue()).resolves.toBe('2.36');
    await page.locator('[data-test="setup-save"]').click();
    await page.locator('[data-test="setup-timeline"]').getByText('Measured again; nothing had changed.').waitFor();
    await expect(page.locator('[data-test="setup-timeline"]').getByText('→').count()).resolves.toBe(0);

    let history = await getJson<BikeHistory>(page, `/api/rider/bikes/${bikeId}`);
    expect(history.snapshots).toHaveLength(2);
    expect(history.snapshots[1]!.setup).toEqual(STORED);

    // A number the rider types in inches is converted once, exactly: 28.5 in = 723.9 mm.
    await page.locator('[data-test="measure-again"]').click();
    await box(page, 'saddleHeight').fill('28.5');
    await page.locator('[data-test="setup-save"]').click();
    await page.locator('[data-test="setup-timeline"]').getByText('28.35 in →').waitFor();
    history = await getJson<BikeHistory>(page, `/api/rider/bikes/${bikeId}`);
    expect(history.snapshots).toHaveLength(3);
    expect(history.snapshots[2]!.setup).toEqual({ ...STORED, saddleHeight: 723.9 });
    await context.close();
  });

  it('saves About me in inches without moving height or inseam, shows the guides in inches, and stores a typed inseam exactly', async () => {
    const { context, page } = await openPage(session.browser);
    await riderWithBike(page);
    await page.goto('/rider/about-me');
    await page.locator('[data-test="profile-form"]').waitFor();
    await page.locator('[data-test="unit-in"]').click();
    await page.locator('[data-test="unit-mm"]').click();
    await page.locator('[data-test="unit-in"]').click();
    await expect(box(page, 'height').inputValue()).resolves.toBe('68.9');

    const guides = page.locator('[data-test="profile-form"] details');
    await guides.nth(1).locator('summary').click();
    const inseamGuide = await guides.nth(1).innerText();
    expect(inseamGuide).toContain('about 6 in apart');
    expect(inseamGuide).not.toContain('cm');
    await guides.nth(0).locator('summary').click();
    expect(await guides.nth(0).locator('p').innerText()).not.toMatch(/\.\.$/);

    await page.locator('[data-test="profile-save"]').click();
    await page.getByText('Saved.').waitFor();
    let profile = await getJson<{ profile: { unit: string; heightMm: number; inseamMm: number } }>(page, '/api/rider/profile');
    expect(profile.profile).toMatchObject({ unit: 'in', heightMm: 1750, inseamMm: 820 });

    await page.locator('[data-test="profile-form"]').waitFor();
    await box(page, 'inseam').fill('32.5');
    await page.locator('[data-test="profile-save"]').click();
    await expect.poll(async () => (await getJson<typeof profile>(page, '/api/rider/profile')).profile.inseamMm).toBe(825.5);
    profile = await getJson<typeof profile>(page, '/api/rider/profile');
    expect(profile.profile.heightMm).toBe(1750);
    await context.close();
  });
});
