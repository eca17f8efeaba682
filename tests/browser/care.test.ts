import { describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { buildPlan } from '@shared/fit/planner';
import { RED_FLAG_QUESTIONS } from '@shared/fit/triage';
import { currentConsent } from '@shared/rider';
import { PlanStep, Referral } from '@server/models';
import { TEST_PASSWORD } from '../support/factories';
import { caseOnStepOne, checkInBody, today } from '../support/care-factories';
import { TEST_SETUP } from '../support/plan-factories';
import { openPage, signIn } from '../support/browser';
import { appAndBrowser } from '../support/browser-suite';

/*
 * The care loop in the browser: a rider's check-in and its advice, the fitter's alert on Today,
 * a physio accepting a referral and setting limits, and the plan builder keeping to them. Data is
 * made through the real app against the test database (the launcher's server shares it); every
 * test makes its own rider, fitter and physio.
 */

const PHONE = { width: 390, height: 844 };
const URGENT_IDS = RED_FLAG_QUESTIONS.filter((q) => q.level === 'urgent').map((q) => q.id);

const suite = appAndBrowser();

type Case = Awaited<ReturnType<typeof caseOnStepOne>>;

const field = (page: Page, test: string) => page.locator(`[data-test="${test}"] input, [data-test="${test}"] textarea, input[data-test="${test}"], textarea[data-test="${test}"]`).first();

async function signedInTab(email: string, home: string, viewport?: { width: number; height: number }): Promise<{ context: BrowserContext; page: Page }> {
  const { context, page } = await openPage(suite.session.browser, viewport ? { viewport } : {});
  await signIn(page, email, TEST_PASSWORD);
  await page.waitForURL(`**${home}`);
  return { context, page };
}

/** The fitter refers to this case's physio and the rider agrees to share; returns the referral id. */
async function sharedReferral(c: Case): Promise<number> {
  const created = await c.fitter.post(`/api/consultations/${c.consultation.id}/referrals`, { urgency: 'soon', reason: 'Knee sorer after the saddle went up.', findings: 'Front of knee 6/10 after step 1.', attachmentIds: [], physioId: c.physio.user.id });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  const id = created.body.referral.id as number;
  await c.rider.post(`/api/rider/referrals/${id}/consent`, { version: currentConsent('share-with-physio')!.version, agreed: true }).expect(200);
  return id;
}

describe('check-ins, referrals and physio limits in the browser', () => {
  it('shows a rider the advice after a worse check-in, and the fitter sees them on Today', async () => {
    const c = await caseOnStepOne(suite.app.app);
    // The check-in date has passed without one (what the scheduler's overdue job records).
    await PlanStep.update({ checkInDue: today(), overdueAt: new Date() }, { where: { planId: c.planId, stepIndex: 1 } });
    const { context, page } = await signedInTab(c.rider.user.email, '/rider', PHONE);
    const due = page.locator('[data-test="checkin-due"]');
    await due.waitFor();
    await expect(due.getAttribute('data-state')).resolves.toBe('overdue');
    await expect(due.innerText()).resolves.toContain('Check-in overdue');
    await due.locator('[data-test="checkin-go"]').click();
    await page.waitForURL('**/plan/check-in');
    await page.locator('[data-test="checkin-step"]').waitFor();

    // Sending nothing names what is missing, before anything reaches the server.
    await page.locator('[data-test="checkin-submit"]').click();
    const errors = page.locator('[data-test="checkin-errors"]');
    await errors.waitFor();
    await expect(errors.innerText()).resolves.toMatch(/how comfortable/i);

    await field(page, 'checkin-rides').fill('3');
    await field(page, 'checkin-hours').fill('1');
    await field(page, 'checkin-minutes').fill('30');
    await field(page, 'checkin-minutes').press('Tab');
    await page.locator('[data-test="checkin-comfort-3"]').click();
    // The same body map as the intake: the sore knee hurts more than at the start (3 → 6).
    await page.locator('[data-test="region-knee-front-left"]').click();
    await page.locator('[data-test="pain-knee-front-left-6"]').click();
    await page.locator('[data-test="checkin-numbness-no"]').click();
    for (const id of URGENT_IDS) await page.locator(`[data-test="flag-${id}-no"]`).click();
    // The note is plain text: markup characters are refused with the shared schema's message.
    await field(page, 'checkin-note').fill('Sore on the climbs, <b>after</b> an hour.');
    await page.locator('[data-test="checkin-submit"]').click();
    await expect(errors.innerText()).resolves.toContain('The note cannot contain < or >.');
    await field(page, 'checkin-note').fill('Sore on the climbs, after an hour.');
    await page.locator('[data-test="checkin-submit"]').click();

    const result = page.locator('[data-test="checkin-result"]');
    await result.waitFor();
    await expect(result.getAttribute('data-decision')).resolves.toBe('suggest-revert');
    await expect(page.locator('[data-test="checkin-status"]').innerText()).resolves.toMatch(/Watch/);
    await expect(page.locator('[data-test="checkin-revert"]').isVisible()).resolves.toBe(true);
    await expect(page.locator('[data-test="urgent-notice"]').count()).resolves.toBe(0);
    await expect(result.locator('[data-test="intake-cautions"]').innerText()).resolves.toContain('does not diagnose');
    await context.close();

    // The fitter's Today lists the rider as getting worse, with a status word and a link into the room.
    const fitter = await signedInTab(c.fitter.user.email, '/fitter');
    const entry = fitter.page.locator(`[data-test="follow-up-worse-${c.planId}"]`);
    await entry.waitFor();
    await expect(entry.innerText()).resolves.toMatch(/Watch/);
    await expect(entry.innerText()).resolves.toContain(c.rider.user.displayName);
    await entry.click();
    await fitter.page.waitForURL(`**/consultations/${c.consultation.id}/room?tab=checkins`);
    await fitter.page.locator('[data-test="checkin-trend-table"]').waitFor({ state: 'attached' });
    await expect(fitter.page.locator('[data-test="checkin-trend-table"] tbody tr').count()).resolves.toBe(2);
    await fitter.context.close();
  });

  it('asks the rider before anything is shared, and a withdrawal closes the case to the physio at once', async () => {
    const c = await caseOnStepOne(suite.app.app);
    const created = await c.fitter.post(`/api/consultations/${c.consultation.id}/referrals`, { urgency: 'routine', reason: 'Pain has not settled after the change.', findings: '', attachmentIds: [], physioId: c.physio.user.id });
    expect(created.status).toBe(201);
    const id = created.body.referral.id as number;
    const { context, page } = await signedInTab(c.rider.user.email, '/rider', PHONE);
    const card = page.locator('[data-test="referral-consent-card"]');
    await card.waitFor();
    await card.locator(`[data-test="referral-consent-go-${id}"]`).click();
    await page.waitForURL(`**/referrals/${id}/consent`);
    await expect(page.locator('[data-test="referral-physio"]').innerText()).resolves.toBe(c.physio.user.displayName);
    await expect(page.locator('[data-test="referral-consent-text"]').innerText()).resolves.toBe(currentConsent('share-with-physio')!.text);

    // Agreeing needs the tick; the shared schema's message says so.
    await page.locator('[data-test="referral-consent-submit"]').click();
    await page.getByText('Please tick the box to agree').waitFor();
    await page.locator('[data-test="referral-consent-agree"]').click();
    await page.locator('[data-test="referral-consent-submit"]').click();
    await page.locator('[data-test="referral-consent-done"]').waitFor();
    expect((await c.physio.get('/api/physio/referrals').expect(200)).body.referrals.map((r: { id: number }) => r.id)).toContain(id);

    const withdraw = page.locator('[data-test^="withdraw-consent-"]').first();
    await withdraw.click();
    await page.locator('[data-test^="withdraw-consent-confirm-"]').first().click();
    await page.locator('[data-test="referral-consent-withdrawn"]').waitFor();
    expect((await c.physio.get('/api/physio/referrals').expect(200)).body.referrals.map((r: { id: number }) => r.id)).not.toContain(id);
    await c.physio.get(`/api/physio/referrals/${id}/case`).expect(404);
    await context.close();
  });

  it('lets a physio accept a referral, open the shared case and answer with limits', async () => {
    const c = await caseOnStepOne(suite.app.app);
    const id = await sharedReferral(c);
    const { context, page } = await signedInTab(c.physio.user.email, '/physio');
    const item = page.locator(`[data-test="referral-${id}"]`);
    await item.waitFor();
    await expect(item.innerText()).resolves.toMatch(/Soon/);
    await item.click();
    await page.waitForURL(`**/physio/referrals/${id}`);

    await page.locator('[data-test="accept-referral"]').click();
    await page.locator('[data-test="physio-case"]').waitFor();
    await expect(page.locator('[data-test="join-room"]').getAttribute('href')).resolves.toBe(`/consultations/${c.consultation.id}/room`);
    await page.locator('[data-test="start-referral"]').click();
    await page.locator('[data-test="referral-status"]').getByText('In progress').waitFor();

    await field(page, 'respond-note').fill('Irritated front of the knee. Keep saddle changes very small; leave the cleats alone.');
    await page.locator('[data-test="respond-decision-continue_with_limits"]').click();
    await field(page, 'limit-cap-saddleHeight').fill('1');
    await page.locator('[data-test="exclude-cleatRotation"]').click();
    await page.locator('[data-test="respond-submit"]').click();

    const answer = page.locator('[data-test="physio-response"]');
    await answer.waitFor();
    await expect(answer.getAttribute('data-decision')).resolves.toBe('continue_with_limits');
    await expect(answer.innerText()).resolves.toContain('saddle height ≤ 1 mm per step');
    await expect(answer.innerText()).resolves.toContain('cleat rotation excluded');
    const inputs = await c.fitter.get(`/api/consultations/${c.consultation.id}/plan-inputs?bikeId=${c.bikeId}`).expect(200);
    expect(inputs.body.physio).toMatchObject({ stepCaps: { saddleHeight: 1 }, excludedParameters: ['cleatRotation'] });

    // The physio joins the consultation room as a third party and can write to both.
    await page.locator('[data-test="join-room"]').click();
    await page.waitForURL(`**/consultations/${c.consultation.id}/room`);
    await page.locator('[data-test="session-room"]').waitFor();
    await expect(page.locator('.room__with').innerText()).resolves.toContain(c.rider.user.displayName);
    await context.close();
  });

  it("shows the physio's limits in the fitter's plan builder, previews within them and refuses a plan over them", async () => {
    const c = await caseOnStepOne(suite.app.app);
    const id = await sharedReferral(c);
    await c.physio.post(`/api/physio/referrals/${id}/accept`).expect(200);
    await c.physio
      .post(`/api/physio/referrals/${id}/respond`, { note: 'Go gently.', decision: 'continue_with_limits', limits: { stepCaps: { saddleHeight: 1 }, excludedParameters: ['cleatRotation'] } })
      .expect(200);

    const { context, page } = await signedInTab(c.fitter.user.email, '/fitter');
    await page.goto(`/consultations/${c.consultation.id}/room?tab=plan`);
    const limits = page.locator('[data-test="plan-physio-limits"]');
    await limits.waitFor();
    await expect(limits.innerText()).resolves.toContain('saddle height ≤ 1 mm per step');
    await expect(limits.innerText()).resolves.toContain('cleat rotation excluded');

    // A 3 mm target becomes three 1 mm steps in the preview.
    await field(page, 'plan-target-saddleHeight').fill(String(TEST_SETUP.saddleHeight + 9));
    await field(page, 'plan-target-saddleHeight').press('Tab');
    const preview = page.locator('[data-test="plan-preview"]');
    await preview.waitFor();
    await expect.poll(async () => Number(await preview.getAttribute('data-steps'))).toBeGreaterThanOrEqual(3);

    // A plan built without the limits, sent straight to the API from the same session, is refused.
    const inputs = (await page.request.get(`/api/consultations/${c.consultation.id}/plan-inputs?bikeId=${c.bikeId}`)).json() as Promise<Record<string, unknown>>;
    const { bikeId: _bikeId, physio: _physio, ...withoutLimits } = await inputs;
    const target = { ...TEST_SETUP, saddleHeight: TEST_SETUP.saddleHeight + 6 };
    const tampered = buildPlan({ ...(withoutLimits as Omit<Parameters<typeof buildPlan>[0], 'target'>), target });
    const csrf = ((await (await page.request.get('/api/auth/csrf')).json()) as { csrfToken: string }).csrfToken;
    const refused = await page.request.post(`/api/consultations/${c.consultation.id}/plans`, {
      data: { bikeId: c.bikeId, target, startDate: (await inputs).startDate, plan: tampered },
      headers: { 'X-CSRF-Token': csrf },
    });
    expect(refused.status()).toBe(422);
    await context.close();
  });

  it("alerts the fitter's open Today page to an urgent check-in, and the physio and rider read what was reported and answered", async () => {
    const c = await caseOnStepOne(suite.app.app);
    const fitter = await signedInTab(c.fitter.user.email, '/fitter');
    await fitter.page.locator('[data-test="home-fitter"]').waitFor();
    await expect(fitter.page.locator(`[data-test="follow-up-worse-${c.planId}"]`).count()).resolves.toBe(0);

    // The rider checks in through the browser's server (the one the fitter's socket is on): leg weakness, knee 3 → 6.
    const rider = await signedInTab(c.rider.user.email, '/rider');
    const csrf = ((await (await rider.page.request.get('/api/auth/csrf')).json()) as { csrfToken: string }).csrfToken;
    const body = checkInBody({ pains: [{ region: 'knee-front-left', pain: 6 }], note: 'Left leg felt weak on the stairs.', redFlagAnswers: { ...Object.fromEntries(URGENT_IDS.map((id) => [id, false])), 'leg-weakness': true } });
    const sent = await rider.page.request.post(`/api/plans/${c.planId}/steps/1/check-ins`, { data: body, headers: { 'X-CSRF-Token': csrf } });
    expect(sent.status()).toBe(201);

    // Without a reload: a notification with a link, and the rider listed first as urgent.
    const alert = fitter.page.locator('[data-test="care-alert"]');
    await alert.waitFor();
    await expect(alert.getAttribute('data-kind')).resolves.toBe('checkin-urgent');
    const entry = fitter.page.locator(`[data-test="follow-up-worse-${c.planId}"]`);
    await entry.waitFor();
    await expect(entry.getAttribute('data-status')).resolves.toBe('urgent');
    await expect(entry.innerText()).resolves.toMatch(/Urgent/);
    await alert.locator('[data-test="care-alert-open"]').click();
    await fitter.page.waitForURL(`**/consultations/${c.consultation.id}/room?tab=checkins`);
    await fitter.context.close();

    // The rider's next step is the urgent advice, not "ready to book".
    await rider.page.goto('/rider');
    await expect.poll(() => rider.page.locator('[data-test="next-action"]').getAttribute('data-kind')).toBe('seek_care');
    await expect(rider.page.locator('[data-test="home-readiness"]').count()).resolves.toBe(0);

    // The urgent referral goes to this case's physio; the rider agrees and the physio accepts.
    const referral = await Referral.findOne({ where: { consultationId: c.consultation.id, urgency: 'urgent' } });
    expect(referral).not.toBeNull();
    await referral!.update({ physioId: c.physio.user.id });
    await c.rider.post(`/api/rider/referrals/${referral!.id}/consent`, { version: currentConsent('share-with-physio')!.version, agreed: true }).expect(200);
    await c.physio.post(`/api/physio/referrals/${referral!.id}/accept`).expect(200);
    const physio = await signedInTab(c.physio.user.email, '/physio');
    await physio.page.goto(`/physio/referrals/${referral!.id}`);
    const record = physio.page.locator('[data-test="checkin-record"]').first();
    await record.waitFor();
    await expect(record.locator('[data-test="checkin-record-flags"]').innerText()).resolves.toContain(RED_FLAG_QUESTIONS.find((q) => q.id === 'leg-weakness')!.text);
    await expect(record.innerText()).resolves.toContain('Left leg felt weak on the stairs.');
    await expect(record.innerText()).resolves.toMatch(/Urgent/);
    await physio.context.close();

    // The physio's answer reaches the rider: on My fit and on the referral page.
    await c.physio.post(`/api/physio/referrals/${referral!.id}/respond`, { note: 'Seen in clinic: nerve irritation has settled. Keep changes small.', decision: 'continue' }).expect(200);
    await rider.page.goto('/rider');
    const answer = rider.page.locator('[data-test="rider-physio-answer"]');
    await answer.waitFor();
    await expect(answer.innerText()).resolves.toContain('Keep changes small.');
    await answer.locator('[data-test="rider-physio-answer-open"]').click();
    await rider.page.locator('[data-test="referral-answer"]').waitFor();
    await expect(rider.page.locator('[data-test="referral-answer"]').innerText()).resolves.toContain('nerve irritation has settled');
    await rider.context.close();
  });
});
