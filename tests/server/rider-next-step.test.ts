import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SaddlestepApp } from '@server/app';
import { PlanStep } from '@server/models';
import { startTestApp } from '../support/app';
import { caseOnStepOne, checkInBody, skipAdaptationDays, today } from '../support/care-factories';
import { signedInAs } from '../support/factories';
import { submitIntake } from '../support/rider-factories';

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

  it('offers to continue a saved draft instead of starting again, and to book once the answers are sent', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const next = async () => (await rider.get('/api/rider/home').expect(200)).body.nextAction as { kind: string };
    await expect(next()).resolves.toEqual({ kind: 'tell_us_what_hurts' });
    await rider.put('/api/rider/intake/draft', { symptoms: [{ region: 'knee-front-left', pain: 3 }] }).expect(200);
    await expect(next()).resolves.toEqual({ kind: 'continue_intake' });
    await submitIntake(rider);
    await expect(next()).resolves.toEqual({ kind: 'book' });
  });

  it('starts afresh once the rider throws the draft away', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    await rider.put('/api/rider/intake/draft', { goals: ['ride-longer'] }).expect(200);
    await rider.delete('/api/rider/intake/draft').expect(204);
    await expect(rider.get('/api/rider/home').expect(200).then((r) => r.body.nextAction)).resolves.toEqual({ kind: 'tell_us_what_hurts' });
  });
});
