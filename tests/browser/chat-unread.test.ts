import { describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { TEST_PASSWORD } from '../support/factories';
import { bookedPair } from '../support/chat-factories';
import { ask, openSocket } from '../support/sockets';
import { openPage, signIn, testBaseUrl } from '../support/browser';
import { appAndBrowser } from '../support/browser-suite';

/*
 * The unread badge: a rider signed in on My fit (not in the room) sees a count when the fitter
 * writes, follows it to the thread, and the count clears once the thread is read. The fitter
 * writes through the launcher's server (the one the browser talks to), signed in over HTTP.
 */

const suite = appAndBrowser();

const cookiesOf = (res: Response) => res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');

/** Sign in against the launcher's server like a browser would, returning the session cookie. */
async function signInOverHttp(email: string): Promise<string> {
  const csrf = await fetch(`${testBaseUrl()}/api/auth/csrf`);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const res = await fetch(`${testBaseUrl()}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': csrfToken, Cookie: cookiesOf(csrf) },
    body: JSON.stringify({ email, password: TEST_PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`sign-in failed: ${res.status}`);
  return cookiesOf(res);
}

describe('unread badge', () => {
  it('counts messages for a rider on another page, links to the thread and clears once read', async () => {
    const { rider, fitter, consultation } = await bookedPair(suite.app.app);
    const { context, page } = await openPage(suite.session.browser);
    try {
      await signIn(page, rider.user.email, TEST_PASSWORD);
      await page.waitForURL('**/rider');
      const badge = page.locator('[data-test="unread-badge"]');
      expect(await badge.count()).toBe(0);

      const { socket, error } = await openSocket(testBaseUrl(), await signInOverHttp(fitter.user.email));
      expect(error).toBeUndefined();
      expect(await ask(socket, 'room:join', { consultationId: consultation.id })).toMatchObject({ status: 'OK' });
      for (const body of ['Morning! How did the ride feel?', 'Any knee ache?']) {
        expect(await ask(socket, 'message:send', { consultationId: consultation.id, clientId: randomUUID(), body })).toMatchObject({ status: 'OK' });
      }
      await expect.poll(() => badge.getAttribute('data-count'), { timeout: 10_000 }).toBe('2');

      await badge.click();
      await page.waitForURL(`**/consultations/${consultation.id}/room`);
      await page.locator('[data-test="message"]').nth(1).waitFor();
      await expect.poll(() => badge.count(), { timeout: 10_000 }).toBe(0);
      socket.close();
    } finally {
      await context.close();
    }
  }, 60_000);
});
