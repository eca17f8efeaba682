import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { currentConsent } from '@shared/rider';
import type { SaddlestepApp } from '@server/app';
import { startTestApp } from '../support/app';
import { calmIntake } from '../support/booking-factories';
import { signedInAs } from '../support/factories';
import { caseWithBike } from '../support/plan-factories';
import { caseOnStepOne, checkInBody, skipAdaptationDays, today } from '../support/care-factories';
import { Plan } from '@server/models';

/**
 * A warning sign that is not urgent stops planning until a physiotherapist has looked at it
 * (TRADE §6). Once the physio answers "continue" on a referral closed after those answers, the
 * server tells the planner the flags are cleared, so the case is not stuck for ever.
 */
let saddlestep: SaddlestepApp;

beforeAll(async () => {
  saddlestep = await startTestApp();
});

afterAll(async () => {
  await saddlestep?.close();
});

type Case = Awaited<ReturnType<typeof caseWithBike>>;

async function planInputs(c: Case) {
  return (await c.fitter.get(`/api/consultations/${c.consultation.id}/plan-inputs?bikeId=${c.bikeId}`).expect(200)).body;
}

async function physioAnswers(c: Case, decision: 'continue' | 'hold') {
  const physio = await signedInAs(saddlestep.app, 'physio');
  const referral = await c.fitter.post(`/api/consultations/${c.consultation.id}/referrals`, { urgency: 'soon', reason: 'Pain at night', attachmentIds: [], physioId: physio.user.id }).expect(201);
  const id = referral.body.referral.id as number;
  await c.rider.post(`/api/rider/referrals/${id}/consent`, { version: currentConsent('share-with-physio')!.version, agreed: true }).expect(200);
  await physio.post(`/api/physio/referrals/${id}/accept`).expect(200);
  const body = decision === 'hold' ? { note: 'Seen in clinic.', decision, holdReason: 'Let it settle first.' } : { note: 'Seen in clinic; fine to go on.', decision };
  await physio.post(`/api/physio/referrals/${id}/respond`, body).expect(200);
}

describe('red flags cleared by a physio’s answer', () => {
  it('refuses to plan on a physio-soon intake, then plans once the physio answers continue', async () => {
    const c = await caseWithBike(saddlestep.app, { started: true });
    const intake = calmIntake();
    await c.rider.post('/api/rider/intake/submit', { ...intake, redFlagAnswers: { ...intake.redFlagAnswers, 'pain-at-rest-or-night': true } }).expect(201);

    const before = await planInputs(c);
    expect(before.redFlagLevel).toBe('physio-soon');
    expect(before.physio?.clearedRedFlags ?? false).toBe(false);

    await physioAnswers(c, 'continue');
    const after = await planInputs(c);
    expect(after.redFlagLevel).toBe('physio-soon');
    expect(after.physio.clearedRedFlags).toBe(true);
  });

  it('does not count an answer given before newer warning signs', async () => {
    const c = await caseWithBike(saddlestep.app, { started: true });
    const intake = calmIntake();
    const flagged = { ...intake, redFlagAnswers: { ...intake.redFlagAnswers, 'pain-at-rest-or-night': true } };
    await c.rider.post('/api/rider/intake/submit', flagged).expect(201);
    await physioAnswers(c, 'continue');
    expect((await planInputs(c)).physio.clearedRedFlags).toBe(true);

    // The rider reports the warning sign again after the physio's answer: a new review is needed.
    await new Promise((resolve) => setTimeout(resolve, 1100));
    await c.rider.post('/api/rider/intake/submit', flagged).expect(201);
    expect((await planInputs(c)).physio?.clearedRedFlags ?? false).toBe(false);
  });

  it('takes the rider’s pain from a check-in newer than the intake', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    expect((await planInputs(c)).currentPain).toBe(3);
    await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody({ pains: [{ region: 'knee-front-left', pain: 1 }] })).expect(201);
    expect((await planInputs(c)).currentPain).toBe(1);
  });
});

describe('before each step is made, the rider’s state now is checked again', () => {
  it('holds the next step for review on low comfort with nothing marked, and until every warning check-in is reviewed', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    const low = await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody({ comfort: 1, pains: [], numbness: true })).expect(201);
    expect(low.body.outcome.decision).toBe('hold-for-review');
    const fine = await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody({ comfort: 8, pains: [] })).expect(201);
    expect(fine.body.outcome.decision).toBe('continue');
    await skipAdaptationDays(c.planId, 2);
    const blocked = await c.rider.post(`/api/plans/${c.planId}/steps/2/apply`, { appliedOn: today() }).expect(409);
    expect(blocked.body.error.message).toMatch(/fitter is looking at your check-ins/);
    await c.fitter.post(`/api/check-ins/${low.body.checkIn.id}/review`).expect(200);
    await c.rider.post(`/api/plans/${c.planId}/steps/2/apply`, { appliedOn: today() }).expect(200);
  });

  it('refuses a step beyond limits a physio set after the plan was sent', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody()).expect(201);
    await skipAdaptationDays(c.planId, 2);
    const referral = await c.fitter.post(`/api/consultations/${c.consultation.id}/referrals`, { urgency: 'routine', reason: 'Knee', attachmentIds: [], physioId: c.physio.user.id }).expect(201);
    const id = referral.body.referral.id as number;
    await c.rider.post(`/api/rider/referrals/${id}/consent`, { version: currentConsent('share-with-physio')!.version, agreed: true }).expect(200);
    await c.physio.post(`/api/physio/referrals/${id}/accept`).expect(200);
    await c.physio.post(`/api/physio/referrals/${id}/respond`, { note: 'Small moves only.', decision: 'continue_with_limits', limits: { stepCaps: { saddleHeight: 1 } } }).expect(200);
    const refused = await c.rider.post(`/api/plans/${c.planId}/steps/2/apply`, { appliedOn: today() }).expect(409);
    expect(refused.body.error.message).toMatch(/saddle height moves 3 mm, more than the physiotherapist's limit of 1 mm/);
  });

  it('refuses any step after an urgent intake, even once a hold is lifted', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody()).expect(201);
    await skipAdaptationDays(c.planId, 2);
    const intake = calmIntake();
    await c.rider.post('/api/rider/intake/submit', { ...intake, redFlagAnswers: { ...intake.redFlagAnswers, 'leg-weakness': true } }).expect(201);
    await Plan.update({ status: 'active', holdReason: null }, { where: { id: c.planId } });
    const refused = await c.rider.post(`/api/plans/${c.planId}/steps/2/apply`, { appliedOn: today() }).expect(409);
    expect(refused.body.error.message).toMatch(/do not change your bike now/);
  });
});
