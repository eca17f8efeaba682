import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildPlan, type Plan as PlanBody, type PlanInput } from '@shared/fit/planner';
import { Consultation, Plan } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { startTestApp } from '../support/app';
import { caseWithBike, TEST_SETUP } from '../support/plan-factories';

/*
 * What the server stores when a fitter sends a plan: always its own build from its own inputs,
 * never text, limits or reasons from the request; and only once the session has started.
 */

let saddlestep: SaddlestepApp;
beforeAll(async () => {
  saddlestep = await startTestApp();
});
afterAll(async () => {
  await saddlestep.close();
});

type Case = Awaited<ReturnType<typeof caseWithBike>>;
const raise = (mm: number): PlanInput['target'] => ({ ...TEST_SETUP, saddleHeight: TEST_SETUP.saddleHeight + mm });

/** The plan the workspace previews (the server's inputs through the shared planner), optionally edited, sent. */
async function send(c: Case, target: PlanInput['target'], edit?: (p: PlanBody) => void) {
  const inputs = (await c.fitter.get(`/api/consultations/${c.consultation.id}/plan-inputs?bikeId=${c.bikeId}`).expect(200)).body;
  const { bikeId: _bikeId, physio, ...rest } = inputs;
  const plan = buildPlan({ ...rest, ...(physio ? { physio } : {}), target });
  const honest = structuredClone(plan);
  edit?.(plan);
  const res = await c.fitter.post(`/api/consultations/${c.consultation.id}/plans`, { bikeId: c.bikeId, target, startDate: inputs.startDate, plan });
  return { res, honest };
}

async function storedPlans(c: Case) {
  return Plan.findAll({ where: { consultationId: c.consultation.id } });
}

describe('POST /api/consultations/:id/plans stores the server’s own plan', () => {
  it('stores exactly the plan the server builds, text, limits and dates included', async () => {
    const c = await caseWithBike(saddlestep.app, { started: true });
    const { res, honest } = await send(c, raise(6));
    expect(res.status).toBe(201);
    const [stored] = await storedPlans(c);
    expect(stored!.plan).toEqual(honest);
  });

  it('refuses tampered instructions with 422 and stores nothing', async () => {
    const c = await caseWithBike(saddlestep.app, { started: true });
    const tamper = 'AUDIT TAMPER: raise the saddle 40 mm in one go.';
    const { res } = await send(c, raise(6), (plan) => {
      for (const step of plan.steps) step.instructions = [tamper];
    });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('plan_changed');
    expect(res.body.error.message).toMatch(/step 1 has different instructions/);
    expect(res.body.error.differences).toContain('step 2 has different instructions');
    expect(await storedPlans(c)).toHaveLength(0);
    const listed = await c.rider.get(`/api/consultations/${c.consultation.id}/plans`).expect(200);
    expect(JSON.stringify(listed.body)).not.toContain('AUDIT TAMPER');
  });

  it('refuses tampered limits (no adaptation days, a 50 mm step cap) with 422 and stores nothing', async () => {
    const c = await caseWithBike(saddlestep.app, { started: true });
    const { res } = await send(c, raise(6), (plan) => {
      plan.limits.adaptationDays = 0;
      plan.limits.stepCaps.saddleHeight = 50;
    });
    expect(res.status).toBe(422);
    expect(res.body.error.differences).toContain('its caps or spacing differ');
    expect(await storedPlans(c)).toHaveLength(0);
  });

  it('accepts a preview whose only difference is the cap of a part the plan never moves, and stores the server’s caps', async () => {
    const c = await caseWithBike(saddlestep.app, { started: true });
    // As if the clinic changed its stem cap between the preview and the send: the saddle plan is the same.
    const { res, honest } = await send(c, raise(6), (plan) => {
      plan.limits.stepCaps.stemLength = 7;
    });
    expect(res.status).toBe(201);
    const [stored] = await storedPlans(c);
    expect(stored!.plan.limits.stepCaps.stemLength).toBe(honest.limits.stepCaps.stemLength);
  });

  it('refuses tampered reasons and dates with 422', async () => {
    const c = await caseWithBike(saddlestep.app, { started: true });
    const reasons = await send(c, raise(6), (plan) => plan.reasons.push({ code: 'fitter-note', message: 'Ignore the pain.', parameters: [] }));
    expect(reasons.res.status).toBe(422);
    expect(reasons.res.body.error.differences).toContain('its reasons differ');
    // A later check-in passes the safety rules but is not the server's schedule.
    const dates = await send(c, raise(6), (plan) => (plan.steps[1]!.checkInDue = '2999-01-01'));
    expect(dates.res.status).toBe(422);
    expect(dates.res.body.error.differences).toContain('step 2 has different dates');
    expect(await storedPlans(c)).toHaveLength(0);
  });

  it('still refuses an over-cap plan with its violations', async () => {
    const c = await caseWithBike(saddlestep.app, { started: true });
    const target = raise(6);
    const { res } = await send(c, target, (plan) => {
      plan.steps = [{ ...plan.steps[plan.steps.length - 1]!, index: 1, changes: [{ parameter: 'saddleHeight', from: TEST_SETUP.saddleHeight, to: target.saddleHeight, delta: 6, coupledTo: null }], setupAfter: target }];
      plan.limits.stepCaps.saddleHeight = 50;
    });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('plan_over_limits');
    expect(await storedPlans(c)).toHaveLength(0);
  });
});

describe('when a plan may be sent', () => {
  it('refuses a plan before the session has started with 409 and a clear reason', async () => {
    const c = await caseWithBike(saddlestep.app);
    const { res } = await send(c, raise(3));
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('session_not_started');
    expect(res.body.error.message).toMatch(/Start the session/);
    expect(await storedPlans(c)).toHaveLength(0);
    expect((await Consultation.findByPk(c.consultation.id))!.status).toBe('booked');
  });

  it('lets the fitter replace the plan under way, which supersedes the first', async () => {
    const c = await caseWithBike(saddlestep.app, { started: true });
    const first = (await send(c, raise(3))).res;
    expect(first.status).toBe(201);
    const second = (await send(c, raise(6))).res;
    expect(second.status).toBe(201);
    expect((await Plan.findByPk(first.body.plan.id))!.status).toBe('superseded');
    expect((await Plan.findByPk(second.body.plan.id))!.status).toBe('active');
  });

  it.each(['on_hold', 'completed'] as const)('refuses a plan while the consultation is %s', async (status) => {
    const c = await caseWithBike(saddlestep.app, { started: true });
    // Set directly: reaching these states through the API takes a physio referral or a finished plan.
    await Consultation.update({ status }, { where: { id: c.consultation.id } });
    const { res } = await send(c, raise(3));
    expect(res.status).toBe(409);
    expect(res.body.error.message).toEqual(expect.any(String));
    expect(await storedPlans(c)).toHaveLength(0);
  });
});
