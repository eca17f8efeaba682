import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SaddlestepApp } from '@server/app';
import { PlanStep } from '@server/models';
import { startTestApp } from '../support/app';
import { caseOnStepOne, checkInBody, skipAdaptationDays, today } from '../support/care-factories';

/** The rider home's one next action, worked out on the server in care order. */
let saddlestep: SaddlestepApp;
beforeAll(async () => {
  saddlestep = await startTestApp();
});
afterAll(async () => {
  await saddlestep?.close();
});

describe("the rider's next step", () => {
  it('follows the care order: plan under way, check-in due, step ready, then urgent advice over everything', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    const next = async () => (await c.rider.get('/api/rider/home').expect(200)).body.nextAction as { kind: string; stepIndex?: number };
    await expect(next()).resolves.toMatchObject({ kind: 'plan_under_way' });
    await PlanStep.update({ checkInDue: today() }, { where: { planId: c.planId, stepIndex: 1 } });
    await expect(next()).resolves.toMatchObject({ kind: 'check_in', stepIndex: 1 });
    await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody({ rides: 10 })).expect(201);
    await skipAdaptationDays(c.planId, 2);
    await expect(next()).resolves.toMatchObject({ kind: 'apply_step', stepIndex: 2 });
    await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody({ redFlagAnswers: { 'leg-weakness': true } })).expect(201);
    await expect(next()).resolves.toMatchObject({ kind: 'seek_care' });
  });
});
