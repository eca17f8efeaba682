import { afterAll, beforeAll } from 'vitest';
import type { SaddlestepApp } from '@server/app';
import { startTestApp } from './app';
import { launchBrowser, type BrowserSession } from './browser';

/**
 * For a browser test file: the real app (its factories write to the test database the launcher's
 * server reads) and one Chromium, opened before the file's tests and closed after them.
 */
export function appAndBrowser(): { readonly app: SaddlestepApp; readonly session: BrowserSession } {
  let app: SaddlestepApp | undefined;
  let session: BrowserSession | undefined;
  beforeAll(async () => {
    app = await startTestApp();
    session = await launchBrowser();
  });
  afterAll(async () => {
    await session?.close();
    await app?.close();
  });
  const started = <T>(value: T | undefined): T => {
    if (value === undefined) throw new Error('The browser suite is used before its beforeAll has run.');
    return value;
  };
  return {
    get app() {
      return started(app);
    },
    get session() {
      return started(session);
    },
  };
}
