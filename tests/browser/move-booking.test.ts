import { describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { Consultation } from '@server/models';
import { TEST_PASSWORD } from '../support/factories';
import { buildFitter, isoDateIn, riderReadyToBook } from '../support/booking-factories';
import { openPage, signIn } from '../support/browser';
import { appAndBrowser } from '../support/browser-suite';

/*
 * Moving a paid booking asks once more before it moves: a mis-tap on a time must not move the
 * session and send new invites. Data comes from the factories; the browser uses the launcher's server.
 */
const suite = appAndBrowser();

describe('moving a booked session', () => {
  it('asks before moving; "Choose another time" leaves it where it was, "Move it" moves it', async () => {
    const { fitter } = await buildFitter();
    const rider = await riderReadyToBook(suite.app.app);
    const startsAt = `${isoDateIn(6)}T10:00:00.000Z`;
    const held = await rider.post('/api/consultations', { fitterId: fitter.id, startsAt }).expect(201);
    const id = held.body.consultation.id as number;
    await rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(200);

    const { context, page } = await openPage(suite.session.browser);
    try {
      await signIn(page, rider.user.email, TEST_PASSWORD);
      await page.waitForURL('**/rider');
      await page.goto(`/consultations/${id}`);
      await page.locator('[data-test="move"]').click();
      const slot = page.locator('[data-test="move-panel"] [data-test="slot"]').first();
      await slot.waitFor();
      const newStart = (await slot.getAttribute('data-start'))!;
      await slot.click();
      await page.locator('[data-test="move-confirm"]').waitFor();
      await page.locator('[data-test="move-confirm-no"]').click();
      await expect(page.locator('[data-test="move-confirm"]').count()).resolves.toBe(0);
      expect((await Consultation.findByPk(id))!.startsAt.toISOString()).toBe(startsAt);

      await slot.click();
      await page.locator('[data-test="move-confirm-yes"]').click();
      await expect.poll(async () => (await Consultation.findByPk(id))!.startsAt.toISOString()).toBe(new Date(newStart).toISOString());
    } finally {
      await context.close();
    }
  }, 60_000);
});
