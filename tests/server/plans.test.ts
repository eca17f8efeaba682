import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { buildPlan, type Plan as PlanBody, type PlanInput } from '@shared/fit/planner';
import { Consultation, FitterNote, Message, Plan, PlanStep, ScheduledJob, SetupSnapshot } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { createAppScheduler } from '@server/scheduler/app-scheduler';
import { startTestApp } from '../support/app';
import { signedInAs } from '../support/factories';
import { caseWithBike, TEST_SETUP } from '../support/plan-factories';
import { waitForMails } from '../support/mail';

let saddlestep: SaddlestepApp;
beforeAll(async () => {
  saddlestep = await startTestApp();
});
afterAll(async () => {
  await saddlestep.close();
});

const today = () => new Date().toISOString().slice(0, 10);

/** A case whose live session has started: plans are sent from then on (shared/plan/send-rule.ts). */
const startedCase = () => caseWithBike(saddlestep.app, { started: true });

/** Inputs from the server, a target, and the plan the shared planner makes from them (as the workspace does). */
async function preview(c: Awaited<ReturnType<typeof caseWithBike>>, target: PlanInput['target']) {
  const res = await c.fitter.get(`/api/consultations/${c.consultation.id}/plan-inputs?bikeId=${c.bikeId}`).expect(200);
  const { bikeId: _bikeId, physio, ...inputs } = res.body;
  const plan = buildPlan({ ...inputs, ...(physio ? { physio } : {}), target });
  return { inputs: res.body, plan };
}

async function sendPlan(c: Awaited<ReturnType<typeof caseWithBike>>, target: PlanInput['target'], tamper?: (p: PlanBody) => void) {
  const { inputs, plan } = await preview(c, target);
  tamper?.(plan);
  return c.fitter.post(`/api/consultations/${c.consultation.id}/plans`, { bikeId: c.bikeId, target, startDate: inputs.startDate, plan });
}

describe('plan inputs and sending', () => {
  it('builds the planner inputs on the server from the bike, policy and intake', async () => {
    const c = await caseWithBike(saddlestep.app);
    const { inputs } = await preview(c, TEST_SETUP);
    expect(inputs.baseline).toEqual(TEST_SETUP);
    expect(inputs.currentPain).toBe(3);
    expect(inputs.redFlagLevel).toBe('none');
    expect(inputs.policy.stepCaps.saddleHeight).toBeGreaterThan(0);
  });

  it('stores a plan within the caps, activates the consultation and posts a plan card in the chat', async () => {
    const c = await startedCase();
    const res = await sendPlan(c, { ...TEST_SETUP, saddleHeight: TEST_SETUP.saddleHeight + 6 });
    expect(res.status).toBe(201);
    expect(res.body.plan.steps[0]).toMatchObject({ index: 1, state: 'current' });
    expect(res.body.plan.plan.steps.length).toBeGreaterThanOrEqual(2);
    expect((await Consultation.findByPk(c.consultation.id))!.status).toBe('plan_active');
    const card = await Message.findOne({ where: { consultationId: c.consultation.id, kind: 'plan' } });
    expect(card?.planId).toBe(res.body.plan.id);
  });

  it('refuses a plan whose step is over the cap, even if the client was bypassed, and stores nothing', async () => {
    const c = await startedCase();
    const target = { ...TEST_SETUP, saddleHeight: TEST_SETUP.saddleHeight + 6 };
    const res = await sendPlan(c, target, (plan) => {
      // Squash the plan into one 6 mm jump, twice the default per-step cap.
      const last = plan.steps[plan.steps.length - 1]!;
      plan.steps = [{ ...last, index: 1, changes: [{ parameter: 'saddleHeight', from: TEST_SETUP.saddleHeight, to: target.saddleHeight, delta: 6, coupledTo: null }], setupAfter: target }];
    });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('plan_over_limits');
    expect(res.body.error.violations.length).toBeGreaterThan(0);
    expect(res.body.error.violations[0]).toMatchObject({ message: expect.any(String) });
    expect(await Plan.count({ where: { consultationId: c.consultation.id } })).toBe(0);
  });

  it('refuses a plan that starts from another setup or is malformed', async () => {
    const c = await startedCase();
    const target = { ...TEST_SETUP, saddleHeight: TEST_SETUP.saddleHeight + 3 };
    const wrongBase = await sendPlan(c, target, (plan) => (plan.baseline = { ...plan.baseline, saddleHeight: 700 }));
    expect(wrongBase.status).toBe(422);
    const malformed = await c.fitter.post(`/api/consultations/${c.consultation.id}/plans`, { bikeId: c.bikeId, target, plan: { steps: 'lots' } });
    expect(malformed.status).toBe(422);
    const missing = await c.fitter.post(`/api/consultations/${c.consultation.id}/plans`, { bikeId: c.bikeId, target });
    expect(missing.status).toBe(400);
  });

  it('lets only the assigned fitter send a plan or read the case', async () => {
    const c = await startedCase();
    const other = await signedInAs(saddlestep.app, 'fitter');
    await other.get(`/api/consultations/${c.consultation.id}/case`).expect(404);
    await other.get(`/api/consultations/${c.consultation.id}/plan-inputs?bikeId=${c.bikeId}`).expect(404);
    const { plan } = await preview(c, TEST_SETUP);
    await other.post(`/api/consultations/${c.consultation.id}/plans`, { bikeId: c.bikeId, target: TEST_SETUP, plan }).expect(404);
    await c.rider.get(`/api/consultations/${c.consultation.id}/case`).expect(403);
  });
});

describe('the rider works through the plan', () => {
  it('applies step 1 with a date, records a snapshot and starts the adaptation clock', async () => {
    const c = await startedCase();
    const sent = await sendPlan(c, { ...TEST_SETUP, saddleHeight: TEST_SETUP.saddleHeight + 6 });
    const planId = sent.body.plan.id as number;
    const current = await c.rider.get('/api/rider/plans/current').expect(200);
    expect(current.body.plan.id).toBe(planId);

    const applied = await c.rider.post(`/api/plans/${planId}/steps/1/apply`, { appliedOn: today() }).expect(200);
    const [first, second] = applied.body.plan.steps;
    expect(first).toMatchObject({ state: 'applied', appliedOn: today() });
    expect(first.checkInDue > today()).toBe(true);
    expect(second).toMatchObject({ state: 'current' });
    expect(second.earliestDate >= first.checkInDue).toBe(true);
    const snapshot = await SetupSnapshot.findByPk(first.snapshotId);
    expect(snapshot).toMatchObject({ source: 'step', bikeId: c.bikeId });
    expect(snapshot!.setup.saddleHeight).toBe(sent.body.plan.plan.steps[0].setupAfter.saddleHeight);

    // The next step waits for a check-in, its rides and its date; steps cannot be skipped or repeated.
    const early = await c.rider.post(`/api/plans/${planId}/steps/2/apply`, { appliedOn: today() });
    expect(early.status).toBe(409);
    expect(early.body.error.message).toMatch(/Check in on the last change first/);
    await c.rider.post(`/api/plans/${planId}/steps/1/apply`, { appliedOn: today() }).expect(409);
    expect((await c.rider.post(`/api/plans/${planId}/steps/3/apply`, { appliedOn: today() })).status).toBeGreaterThanOrEqual(400);
  });

  it('refuses dates in the future, malformed dates and other riders', async () => {
    const c = await startedCase();
    const planId = (await sendPlan(c, { ...TEST_SETUP, saddleHeight: TEST_SETUP.saddleHeight + 3 })).body.plan.id;
    await c.rider.post(`/api/plans/${planId}/steps/1/apply`, { appliedOn: '2999-01-01' }).expect(400);
    await c.rider.post(`/api/plans/${planId}/steps/1/apply`, { appliedOn: '2026-02-30' }).expect(400);
    const stranger = await signedInAs(saddlestep.app, 'rider');
    await stranger.post(`/api/plans/${planId}/steps/1/apply`, { appliedOn: today() }).expect(404);
    await stranger.get(`/api/plans/${planId}`).expect(404);
  });

  it('goes back to an earlier setup as a revert plan', async () => {
    const c = await startedCase();
    const planId = (await sendPlan(c, { ...TEST_SETUP, saddleHeight: TEST_SETUP.saddleHeight + 6 })).body.plan.id;
    await c.rider.post(`/api/plans/${planId}/steps/1/apply`, { appliedOn: today() }).expect(200);
    const baseline = await SetupSnapshot.findOne({ where: { bikeId: c.bikeId, source: 'baseline' } });
    const res = await c.rider.post(`/api/rider/bikes/${c.bikeId}/revert`, { snapshotId: baseline!.id });
    expect(res.status).toBe(201);
    expect(res.body.plan).toMatchObject({ kind: 'revert', status: 'active' });
    // The baseline was ridden for weeks, so the way back is one step.
    expect(res.body.plan.plan.steps).toHaveLength(1);
    expect((await Plan.findByPk(planId))!.status).toBe('superseded');
    const applied = await c.rider.post(`/api/plans/${res.body.plan.id}/steps/1/apply`, { appliedOn: today() }).expect(200);
    const snapshot = await SetupSnapshot.findByPk(applied.body.plan.steps[0].snapshotId);
    expect(snapshot).toMatchObject({ source: 'revert', basedOnSnapshotId: baseline!.id });
    expect(snapshot!.setup).toEqual(TEST_SETUP);
  });
});

describe('private notes', () => {
  it('keeps fitter notes from the rider', async () => {
    const c = await startedCase();
    const secret = 'Suspect hip rocking; discuss leg length next time.';
    await c.fitter.post(`/api/consultations/${c.consultation.id}/notes`, { body: secret }).expect(201);
    expect((await c.fitter.get(`/api/consultations/${c.consultation.id}/notes`).expect(200)).body.notes[0].body).toBe(secret);
    await c.rider.get(`/api/consultations/${c.consultation.id}/notes`).expect(403);
    const planId = (await sendPlan(c, { ...TEST_SETUP, saddleHeight: TEST_SETUP.saddleHeight + 3 })).body.plan.id;
    for (const url of [`/api/consultations/${c.consultation.id}`, `/api/plans/${planId}`, '/api/rider/plans/current', `/api/consultations/${c.consultation.id}/plans`]) {
      const res = await c.rider.get(url);
      expect(JSON.stringify(res.body)).not.toContain('hip rocking');
    }
    await c.fitter.post(`/api/consultations/${c.consultation.id}/notes`, { body: '' }).expect(400);
    expect(await FitterNote.count({ where: { consultationId: c.consultation.id } })).toBe(1);
  });
});

describe('photo measurements', () => {
  async function photo(c: Awaited<ReturnType<typeof caseWithBike>>) {
    const png = await sharp({ create: { width: 400, height: 300, channels: 3, background: '#888' } }).png().toBuffer();
    const res = await c.rider.agent.post('/api/rider/uploads').set('X-CSRF-Token', c.rider.csrfToken).field('view', 'side-crank-6').attach('file', png, 'side.png');
    if (res.status !== 201) throw new Error(`upload failed ${res.status} ${JSON.stringify(res.body)}`);
    return res.body.upload.id as number;
  }

  const points = { hip: { x: 100, y: 50 }, knee: { x: 200, y: 130 }, ankle: { x: 180, y: 260 }, kneeFront: { x: 215, y: 130 }, spindle: { x: 200, y: 280 } };

  it('recomputes and stores the angles on the server', async () => {
    const c = await caseWithBike(saddlestep.app);
    const uploadId = await photo(c);
    const res = await c.fitter.post(`/api/uploads/${uploadId}/measurements`, { consultationId: c.consultation.id, input: { points, clickPrecisionPx: 3, facing: 'right' } });
    expect(res.status).toBe(201);
    expect(res.body.measurement.result.kneeFlexion.value).toBeGreaterThan(0);
    const list = await c.fitter.get(`/api/uploads/${uploadId}/measurements?consultationId=${c.consultation.id}`).expect(200);
    expect(list.body.measurements).toHaveLength(1);
  });

  it('answers coinciding points with a clear 400 and unrelated fitters with 404', async () => {
    const c = await caseWithBike(saddlestep.app);
    const uploadId = await photo(c);
    const bad = await c.fitter.post(`/api/uploads/${uploadId}/measurements`, { consultationId: c.consultation.id, input: { points: { ...points, knee: points.hip }, clickPrecisionPx: 3, facing: 'right' } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toEqual(expect.any(String));
    const other = await signedInAs(saddlestep.app, 'fitter');
    await other.post(`/api/uploads/${uploadId}/measurements`, { consultationId: c.consultation.id, input: { points, clickPrecisionPx: 3, facing: 'right' } }).expect(404);
  });
});

describe('follow-ups', () => {
  it('lists due check-ins for the fitter and marks them overdue exactly once with two schedulers', async () => {
    const c = await startedCase();
    const planId = (await sendPlan(c, { ...TEST_SETUP, saddleHeight: TEST_SETUP.saddleHeight + 3 })).body.plan.id;
    await c.rider.post(`/api/plans/${planId}/steps/1/apply`, { appliedOn: today() }).expect(200);
    const step = (await PlanStep.findOne({ where: { planId, stepIndex: 1 } }))!;
    await step.update({ checkInDue: today() });
    const due = await c.fitter.get('/api/fitter/follow-ups').expect(200);
    expect(due.body.due.map((d: { planId: number }) => d.planId)).toContain(planId);

    await ScheduledJob.update({ runAt: new Date(Date.now() - 1000) }, { where: { uniqueKey: [`checkin-due:${step.id}`, `checkin-overdue:${step.id}`] } });
    const { Sequelize } = await import('sequelize');
    const otherPool = new Sequelize(process.env.DATABASE_URL!, { dialect: 'mariadb', logging: false, timezone: '+00:00' });
    try {
      await Promise.all([createAppScheduler(saddlestep.ctx).tick(), createAppScheduler(saddlestep.ctx, { sequelize: otherPool }).tick()]);
    } finally {
      await otherPool.close();
    }
    expect(await waitForMails(c.rider.user.email, { subject: /Time for a check-in/, count: 2, timeoutMs: 1500 })).toHaveLength(1);
    expect(await waitForMails(c.fitter.user.email, { subject: /Check-in overdue/, count: 2, timeoutMs: 1500 })).toHaveLength(1);
    const overdue = await c.fitter.get('/api/fitter/follow-ups').expect(200);
    expect(overdue.body.overdue.map((d: { planId: number }) => d.planId)).toContain(planId);
  });
});
