import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

/** Flags that keep Debian's Chromium quiet on a machine with no outside network. */
const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

export function testBaseUrl(): string {
  const url = process.env.SADDLESTEP_TEST_URL;
  if (!url) throw new Error('Browser tests need the test stack: run them through `npm test` (e.g. `npm test -- tests/browser`).');
  return url;
}

export interface BrowserSession {
  browser: Browser;
  close: () => Promise<void>;
}

/** The system Chromium; playwright gives each launch a fresh, temporary profile of its own. */
export async function launchBrowser(): Promise<BrowserSession> {
  const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS });
  return { browser, close: () => browser.close() };
}

/** A new tab (own cookies) that records every request URL it makes. */
export async function openPage(browser: Browser, options: { viewport?: { width: number; height: number } } = {}): Promise<{ context: BrowserContext; page: Page; requests: string[] }> {
  const context = await browser.newContext({ baseURL: testBaseUrl(), viewport: options.viewport ?? { width: 1280, height: 800 } });
  const page = await context.newPage();
  const requests: string[] = [];
  page.on('request', (request) => requests.push(request.url()));
  return { context, page, requests };
}

export async function signIn(page: Page, email: string, password: string) {
  await page.goto('/sign-in');
  await page.locator('[data-test="email"] input, input[data-test="email"]').first().fill(email);
  await page.locator('[data-test="password"] input, input[data-test="password"]').first().fill(password);
  await page.locator('[data-test="submit"]').click();
}
