import { describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { buildPlan, type PlanInput } from '@shared/fit/planner';
import { TEST_PASSWORD } from '../support/factories';
import { caseWithBike, TEST_SETUP } from '../support/plan-factories';
import { openPage, signIn } from '../support/browser';
import { appAndBrowser } from '../support/browser-suite';

/*
 * Plans in the browser after they are sent: the fitter follows them on the Plan builder tab, the
 * rider reads them in their own unit on a phone, and the way back offers the setup just made.
 * Each test makes its own rider, fitter, bike and consultation through the real app.
 */

const PHONE = { width: 390, height: 844 };
const WIDE = { width: 1440, height: 960 };

const suite = appAndBrowser();

type Case = Awaited<ReturnType<typeof caseWithBike>>;

async function signedInTab(email: string, home: string, viewport = WIDE): Promise<{ context: BrowserContext; page: Page }> {
  const { context, page } = await openPage(suite.session.browser, { viewport });
  await signIn(page, email, TEST_PASSWORD);
  await page.waitForURL(`**${home}`);
  return { context, page };
}

/** Send a plan through the API the way the workspace does (preview with the server's inputs). */
async function sendPlan(c: Case, target: PlanInput['target']): Promise<number> {
  const inputs = (await c.fitter.get(`/api/consultations/${c.consultation.id}/plan-inputs?bikeId=${c.bikeId}`).expect(200)).body;
  const { bikeId: _bikeId, physio, ...rest } = inputs;
  const plan = buildPlan({ ...rest, ...(physio ? { physio } : {}), target });
  const res = await c.fitter.post(`/api/consultations/${c.consultation.id}/plans`, { bikeId: c.bikeId, target, startDate: inputs.startDate, plan });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.plan.id as number;
}

const today = () => new Date().toISOString().slice(0, 10);

describe('plans in the browser', () => {
  it('keeps Send disabled with the reason until the session has started', async () => {
    const c = await caseWithBike(suite.app.app);
    const { context, page } = await signedInTab(c.fitter.user.email, '/fitter');
    await page.goto(`/consultations/${c.consultation.id}/room?tab=plan`);
    const saddle = page.locator('[data-test="plan-target-saddleHeight"] input');
    await saddle.waitFor();
    await saddle.fill(String(TEST_SETUP.saddleHeight + 3));
    await saddle.blur();
    await page.locator('[data-test="plan-preview"]').waitFor();
    await expect(page.locator('[data-test="send-plan"]').isDisabled()).resolves.toBe(true);
    await expect(page.locator('[data-test="send-blocked"]').innerText()).resolves.toContain('Start the session');
    await context.close();
  });

  it('shows the fitter the plans already sent, with each step’s state, after a reload', async () => {
    const c = await caseWithBike(suite.app.app, { started: true });
    const planId = await sendPlan(c, { ...TEST_SETUP, saddleHeight: TEST_SETUP.saddleHeight + 6 });
    await c.rider.post(`/api/plans/${planId}/steps/1/apply`, { appliedOn: today() }).expect(200);

    const { context, page } = await signedInTab(c.fitter.user.email, '/fitter');
    await page.goto(`/consultations/${c.consultation.id}/room?tab=plan`);
    const sent = page.locator(`[data-test="sent-plan-${planId}"]`);
    await sent.waitFor();
    await expect(sent.getAttribute('data-status')).resolves.toBe('active');
    await expect(page.locator(`[data-test="sent-step-${planId}-1"]`).getAttribute('data-state')).resolves.toBe('applied');
    await expect(page.locator(`[data-test="sent-step-${planId}-1"]`).innerText()).resolves.toMatch(/check-in due/);
    await expect(page.locator(`[data-test="sent-step-${planId}-2"]`).getAttribute('data-state')).resolves.toBe('released');
    // The builder is still there, and says what sending another plan does.
    await page.locator('[data-test="plan-target-saddleHeight"] input').waitFor();
    await expect(page.locator('[data-test="send-replaces"]').innerText()).resolves.toContain('replaces the plan');
    await context.close();
  });

  it('writes the step instructions in inches for a rider who uses inches, and offers the setup just left to go back to', async () => {
    const c = await caseWithBike(suite.app.app, { started: true });
    await c.rider.put('/api/rider/unit-preference', { unit: 'in' }).expect(200);
    await sendPlan(c, { ...TEST_SETUP, drop: TEST_SETUP.drop - 5 });
    const { context, page } = await signedInTab(c.rider.user.email, '/rider', PHONE);
    await page.goto('/plan');
    const card = page.locator('[data-test="plan-step-current"]');
    await card.waitFor();
    const instructions = await page.locator('[data-test="step-instructions"]').innerText();
    expect(instructions).toMatch(/Raise the bars 0\.\d\d in/);
    expect(instructions).toMatch(/It should read \d+\.\d\d in/);
    expect(instructions).not.toMatch(/\d mm\b/);
    const amount = await card.locator('[data-test="change-drop"] .step__amount').innerText();
    expect(instructions).toContain(amount.replace(/^[+−]/, ''));

    // The step diagram's label fits on the phone (the 400-wide drawing is not cut off).
    const diagram = page.locator('[data-test="plan-step-diagram"]');
    await expect(diagram.getAttribute('data-parameter')).resolves.toBe('drop');
    const label = await page.locator('[data-test="diagram-label"]').evaluate((el) => {
      const box = (el as SVGGraphicsElement).getBBox();
      return { left: box.x, right: box.x + box.width };
    });
    expect(label.left).toBeGreaterThanOrEqual(0);
    expect(label.right).toBeLessThanOrEqual(400);
    await diagram.screenshot({ path: '/tmp/saddlestep-plan-diagram-390.png' });

    // Before the change only the starting setup exists; after it, the revert panel offers it at once.
    await expect(page.locator('[data-test="plan-revert"]').innerText()).resolves.toContain('There is no earlier setup of this bike yet');
    await page.locator('[data-test="apply-step"]').click();
    await page.locator('[data-test="plan-revert"] [data-test^="revert-choice-"]').first().waitFor();
    await expect(page.locator('[data-test="plan-revert"]').innerText()).resolves.not.toContain('There is no earlier setup');
    await context.close();
  });
});
