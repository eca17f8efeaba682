import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { currentConsent } from '@shared/rider';
import { Consultation, Plan, Referral, ScheduledJob } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { createAppScheduler } from '@server/scheduler/app-scheduler';
import { startTestApp } from '../support/app';
import { caseOnStepOne, checkInBody, sendBuiltPlan, skipAdaptationDays, today } from '../support/care-factories';
import { TEST_SETUP } from '../support/plan-factories';
import { mailsTo, waitForMails } from '../support/mail';
import { ask, listenOnFreePort } from '../support/sockets';
import { socketFor } from '../support/chat-factories';
import { signedInAs } from '../support/factories';

let saddlestep: SaddlestepApp;
beforeAll(async () => {
  saddlestep = await startTestApp();
});
afterAll(async () => {
  await saddlestep.close();
});

type Case = Awaited<ReturnType<typeof caseOnStepOne>>;
const shareVersion = () => currentConsent('share-with-physio')!.version;

async function upload(c: Case) {
  const png = await sharp({ create: { width: 60, height: 40, channels: 3, background: '#555' } }).png().toBuffer();
  const res = await c.rider.agent.post('/api/rider/uploads').set('X-CSRF-Token', c.rider.csrfToken).field('view', 'front').attach('file', png, 'f.png');
  return res.body.upload.id as number;
}

/** Fitter refers to this case's physio, sharing `attachmentIds`; the rider agrees. */
async function referredAndConsented(c: Case, attachmentIds: number[] = []) {
  const created = await c.fitter.post(`/api/consultations/${c.consultation.id}/referrals`, { urgency: 'soon', reason: 'Knee worse after saddle change', findings: 'Anterior knee pain 6/10.', attachmentIds, physioId: c.physio.user.id });
  expect(created.status).toBe(201);
  expect(created.body.referral.status).toBe('awaiting_consent');
  const id = created.body.referral.id as number;
  return { id, consent: () => c.rider.post(`/api/rider/referrals/${id}/consent`, { version: shareVersion(), agreed: true }) };
}

describe('check-ins', () => {
  it('continues when nothing got worse; the next step unlocks on its date and ride count', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    const res = await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody({ rides: 1 }));
    expect(res.status).toBe(201);
    expect(res.body.outcome).toMatchObject({ decision: 'continue', planOnHold: false, ridesStillNeeded: expect.any(Number) });
    await skipAdaptationDays(c.planId, 2);
    const notEnough = await c.rider.post(`/api/plans/${c.planId}/steps/2/apply`, { appliedOn: today() });
    expect(notEnough.status).toBe(409);
    expect(notEnough.body.error.message).toMatch(/Ride at least/);
    await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody({ rides: 10 })).expect(201);
    await c.rider.post(`/api/plans/${c.planId}/steps/2/apply`, { appliedOn: today() }).expect(200);
  });

  it('suggests going back after a much worse check-in, alerts the fitter, and undoes the step in one action', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    const res = await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody({ pains: [{ region: 'knee-front-left', pain: 6 }], comfort: 3 }));
    expect(res.body.outcome.decision).toBe('suggest-revert');
    expect(await waitForMails(c.fitter.user.email, { subject: /check-in/ })).toHaveLength(1);
    const followUps = await c.fitter.get('/api/fitter/follow-ups').expect(200);
    expect(followUps.body.gettingWorse.map((g: { planId: number }) => g.planId)).toContain(c.planId);
    const undo = await c.rider.post(`/api/plans/${c.planId}/steps/1/revert`, {});
    expect(undo.status).toBe(201);
    expect(undo.body.plan).toMatchObject({ kind: 'revert' });
    expect(undo.body.plan.plan.target).toEqual(TEST_SETUP);
  });

  it('holds the plan at once on an urgent red flag, opens an urgent referral and shows urgent advice', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    const res = await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody({ redFlagAnswers: { 'saddle-numbness-persists': true } }));
    expect(res.status).toBe(201);
    expect(res.body.outcome).toMatchObject({ decision: 'refer', planOnHold: true, urgentAdvice: expect.stringMatching(/urgent medical care/) });
    expect((await Plan.findByPk(c.planId))!.status).toBe('on_hold');
    expect((await Consultation.findByPk(c.consultation.id))!.status).toBe('on_hold');
    const referral = await Referral.findByPk(res.body.outcome.referralId);
    expect(referral).toMatchObject({ urgency: 'urgent', origin: 'red-flag', status: 'awaiting_consent' });
    await skipAdaptationDays(c.planId, 2);
    const blocked = await c.rider.post(`/api/plans/${c.planId}/steps/2/apply`, { appliedOn: today() });
    expect(blocked.status).toBe(409);
    expect(blocked.body.error.message).toMatch(/paused/);
    expect(await waitForMails(c.fitter.user.email, { subject: /Urgent/ })).toHaveLength(1);
  });

  it('refuses a check-in on a step not yet made, and bad input, writing nothing', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    await c.rider.post(`/api/plans/${c.planId}/steps/2/check-ins`, checkInBody()).expect(409);
    for (const body of [{}, checkInBody({ comfort: 11 }), checkInBody({ pains: [{ region: 'elbow', pain: 3 }] }), checkInBody({ note: '<script>x</script>' }), checkInBody({ rides: -1 }), checkInBody({ extra: true })]) {
      const res = await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, body);
      expect(res.status).toBe(400);
    }
    const stranger = await signedInAs(saddlestep.app, 'rider');
    await stranger.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody()).expect(404);
  });
});

describe('referral to a physio', () => {
  it('shares nothing until the rider consents, then follows sent → received → accepted → closed', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    const { id, consent } = await referredAndConsented(c);
    expect((await c.physio.get('/api/physio/referrals').expect(200)).body.referrals).toHaveLength(0);
    await c.physio.get(`/api/physio/referrals/${id}/case`).expect(404);
    const consented = await consent();
    expect(consented.status).toBe(200);
    expect(consented.body.referral.status).toBe('sent');
    const inbox = await c.physio.get('/api/physio/referrals').expect(200);
    expect(inbox.body.referrals.map((r: { id: number }) => r.id)).toEqual([id]);
    await c.physio.post(`/api/physio/referrals/${id}/receive`).expect(200);
    expect((await c.physio.get(`/api/physio/referrals/${id}/case`)).status).toBe(409);
    await c.physio.post(`/api/physio/referrals/${id}/accept`).expect(200);
    const caseView = await c.physio.get(`/api/physio/referrals/${id}/case`).expect(200);
    expect(caseView.body.intake.symptoms[0].region).toBe('knee-front-left');
    expect(caseView.body.plan.id).toBe(c.planId);
    await c.physio.post(`/api/physio/referrals/${id}/start`).expect(200);
    const closed = await c.physio.post(`/api/physio/referrals/${id}/respond`, { note: 'Patellofemoral irritation; keep changes small.', decision: 'continue' });
    expect(closed.body.referral).toMatchObject({ status: 'closed', decision: 'continue' });
    await c.physio.post(`/api/physio/referrals/${id}/accept`).expect(409);
  });

  it('makes the planner and the server honour physio limits', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    const { id, consent } = await referredAndConsented(c);
    await consent();
    await c.physio.post(`/api/physio/referrals/${id}/accept`).expect(200);
    await c.physio.post(`/api/physio/referrals/${id}/respond`, { note: 'Go gently.', decision: 'continue_with_limits', limits: { stepCaps: { saddleHeight: 1 }, excludedGroups: ['cleats'] } }).expect(200);
    const inputs = (await c.fitter.get(`/api/consultations/${c.consultation.id}/plan-inputs?bikeId=${c.bikeId}`).expect(200)).body;
    expect(inputs.physio).toMatchObject({ stepCaps: { saddleHeight: 1 }, excludedGroups: ['cleats'] });
    // A plan built with the limits passes; the same target with 3 mm steps (the clinic cap) is refused.
    const target = { ...TEST_SETUP, saddleHeight: TEST_SETUP.saddleHeight + 5 };
    const honest = await sendBuiltPlan(c, target);
    expect(honest.status).toBe(201);
    expect(honest.body.plan.plan.steps.every((s: { changes: { parameter: string; delta: number }[] }) => s.changes.every((ch) => ch.parameter !== 'saddleHeight' || Math.abs(ch.delta) <= 1))).toBe(true);
    const { buildPlan } = await import('@shared/fit/planner');
    const { bikeId: _b, physio: _p, ...withoutLimits } = inputs;
    const bypassed = buildPlan({ ...withoutLimits, target });
    const res = await c.fitter.post(`/api/consultations/${c.consultation.id}/plans`, { bikeId: c.bikeId, target, startDate: inputs.startDate, plan: bypassed });
    expect(res.status).toBe(422);
  });

  it('lets a physio hold the plan, blocking the next step, and only a physio clears it', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    const { id, consent } = await referredAndConsented(c);
    await consent();
    await c.physio.post(`/api/physio/referrals/${id}/accept`).expect(200);
    const held = await c.physio.post(`/api/physio/referrals/${id}/respond`, { note: 'Needs assessment.', decision: 'hold', holdReason: 'Wait for a knee assessment first.' });
    expect(held.status).toBe(200);
    const plan = await c.rider.get('/api/rider/plans/current').expect(200);
    expect(plan.body.plan).toMatchObject({ status: 'on_hold', holdReason: expect.stringContaining('knee assessment') });
    await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody({ rides: 10 })).expect(201);
    await skipAdaptationDays(c.planId, 2);
    expect((await c.rider.post(`/api/plans/${c.planId}/steps/2/apply`, { appliedOn: today() })).status).toBe(409);
    await c.fitter.post(`/api/physio/referrals/${id}/clear-hold`, { note: 'x' }).expect(403);
    await c.physio.post(`/api/physio/referrals/${id}/clear-hold`, { note: 'Assessment fine.' }).expect(200);
    await c.rider.post(`/api/plans/${c.planId}/steps/2/apply`, { appliedOn: today() }).expect(200);
  });

  it('gives the physio only the shared files and a seat in the chat, and withdrawing consent ends both at once', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    const shared = await upload(c);
    const notShared = await upload(c);
    const { id, consent } = await referredAndConsented(c, [shared]);
    await consent().expect(200);
    await c.physio.post(`/api/physio/referrals/${id}/accept`).expect(200);
    await c.physio.get(`/api/uploads/${shared}/thumbnail`).expect(200);
    await c.physio.get(`/api/uploads/${notShared}/thumbnail`).expect(404);
    const baseUrl = await listenOnFreePort(saddlestep);
    const socket = await socketFor(baseUrl, c.physio);
    expect(await ask(socket, 'room:join', { consultationId: c.consultation.id })).toMatchObject({ status: 'OK' });
    socket.close();

    const { consents } = (await c.rider.get('/api/rider/consents').expect(200)).body as { consents: { id: number; kind: string }[] };
    const share = consents.find((k) => k.kind === 'share-with-physio')!;
    await c.rider.post(`/api/rider/consents/${share.id}/withdraw`).expect(200);
    await c.physio.get(`/api/physio/referrals/${id}/case`).expect(404);
    await c.physio.get(`/api/uploads/${shared}/thumbnail`).expect(404);
    const again = await socketFor(baseUrl, c.physio);
    expect(await ask(again, 'room:join', { consultationId: c.consultation.id })).toMatchObject({ status: 'ERROR' });
    again.close();
  });

  it('proposes a referral after repeated worsening, which the fitter confirms', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody({ pains: [{ region: 'knee-front-left', pain: 6 }] })).expect(201);
    const second = await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody({ pains: [{ region: 'knee-front-left', pain: 9 }] }));
    expect(second.body.outcome.decision).toBe('refer');
    const proposal = await Referral.findByPk(second.body.outcome.referralId);
    expect(proposal).toMatchObject({ status: 'proposed', origin: 'system' });
    expect((await c.rider.get('/api/rider/referrals').expect(200)).body.referrals).toHaveLength(0);
    const confirmed = await c.fitter.post(`/api/referrals/${proposal!.id}/confirm`, { urgency: 'soon', reason: 'Repeated worsening', findings: '', attachmentIds: [], physioId: c.physio.user.id });
    expect(confirmed.body.referral.status).toBe('awaiting_consent');
    expect((await c.rider.get('/api/rider/referrals').expect(200)).body.referrals).toHaveLength(1);
  });

  it('escalates a referral nobody has accepted in time', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    const admin = await signedInAs(saddlestep.app, 'admin');
    const { id, consent } = await referredAndConsented(c);
    await consent();
    await ScheduledJob.update({ runAt: new Date(Date.now() - 1000) }, { where: { uniqueKey: `referral-escalate:${id}` } });
    await createAppScheduler(saddlestep.ctx).tick();
    expect((await Referral.findByPk(id))!.escalatedAt).not.toBeNull();
    expect(await waitForMails(c.physio.user.email, { subject: /Overdue soon referral/ })).toHaveLength(1);
    // Each recipient gets a link they can open: the physio their referral, the fitter the room.
    expect((await waitForMails(c.fitter.user.email, { subject: /Overdue/ }))[0]!.text).toContain(`/consultations/${c.consultation.id}/room`);
    expect((await waitForMails(admin.user.email, { subject: /Overdue/ }))[0]!.text).toContain(c.physio.user.displayName);
    await createAppScheduler(saddlestep.ctx).tick();
    await new Promise((r) => setTimeout(r, 300));
    expect((await mailsTo(c.physio.user.email)).filter((m) => /Overdue/.test(m.subject))).toHaveLength(1);
  });

  it('chases an accepted referral the physio never answers, once', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    const { id, consent } = await referredAndConsented(c);
    await consent();
    await c.physio.post(`/api/physio/referrals/${id}/accept`).expect(200);
    const tick = () => createAppScheduler(saddlestep.ctx).tick();
    await ScheduledJob.update({ runAt: new Date(Date.now() - 1000) }, { where: { uniqueKey: `referral-escalate:${id}` } });
    await tick(); // accepted in time: nothing sent, the answer check is set for acceptance + 5 days
    const answerCheck = (await ScheduledJob.findOne({ where: { uniqueKey: `referral-escalate:answer:${id}` } }))!;
    expect(answerCheck.status).toBe('pending');
    // Five days (the "soon" answer window) pass without a response.
    await Referral.update({ acceptedAt: new Date(Date.now() - 6 * 86_400_000) }, { where: { id } });
    await answerCheck.update({ runAt: new Date(Date.now() - 1000) });
    await tick();
    expect(await waitForMails(c.physio.user.email, { subject: /Unanswered soon referral/ })).toHaveLength(1);
    expect((await waitForMails(c.fitter.user.email, { subject: /Unanswered/ }))[0]!.text).toContain(`/consultations/${c.consultation.id}/room`);
    expect((await Referral.findByPk(id))!.escalatedAt).not.toBeNull();
    await tick();
    await new Promise((r) => setTimeout(r, 300));
    const physioMails = await mailsTo(c.physio.user.email);
    expect(physioMails.filter((m) => /Unanswered/.test(m.subject))).toHaveLength(1);
    expect(physioMails.filter((m) => /Overdue/.test(m.subject))).toHaveLength(0);
  });

  it('tells the rider once that an urgent referral waits for their agreement, with no health details', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    const urgent = checkInBody({ redFlagAnswers: { 'saddle-numbness-persists': true } });
    const first = await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, urgent).expect(201);
    await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, urgent).expect(201);
    const id = first.body.outcome.referralId as number;
    await createAppScheduler(saddlestep.ctx).tick();
    await createAppScheduler(saddlestep.ctx).tick();
    const [mail] = await waitForMails(c.rider.user.email, { subject: /suggests a physiotherapist/ });
    expect(mail!.text).toContain(`/referrals/${id}/consent`);
    expect(mail!.text).toMatch(/agree to share/);
    expect(mail!.text).not.toMatch(/urgent|warning signs|saddle numbness|knee|red flag/i);
    await new Promise((r) => setTimeout(r, 300));
    expect((await mailsTo(c.rider.user.email)).filter((m) => /suggests a physiotherapist/.test(m.subject))).toHaveLength(1);
  });

  it('tells the fitter and the clinic when an urgent referral still waits for the rider after the urgent window', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    const admin = await signedInAs(saddlestep.app, 'admin');
    const first = await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody({ redFlagAnswers: { 'saddle-numbness-persists': true } })).expect(201);
    const id = first.body.outcome.referralId as number;
    const overdue = (await ScheduledJob.findOne({ where: { uniqueKey: `referral-escalate:consent-overdue:${id}` } }))!;
    // Four hours (the urgent window) later than now, give or take the test's own run time.
    expect(overdue.runAt.getTime() - Date.now()).toBeGreaterThan(3.9 * 3_600_000);
    await overdue.update({ runAt: new Date(Date.now() - 1000) });
    await createAppScheduler(saddlestep.ctx).tick();
    const [mail] = await waitForMails(c.fitter.user.email, { subject: /Urgent referral waiting for the rider/ });
    expect(mail!.text).toContain(`/consultations/${c.consultation.id}/room`);
    expect(mail!.text).toMatch(/contact the rider/);
    expect(mail!.text).not.toMatch(/saddle numbness|warning signs|red flag|knee/i);
    expect(await waitForMails(admin.user.email, { subject: /waiting for the rider/ })).toHaveLength(1);
    expect((await mailsTo(c.physio.user.email)).filter((m) => /waiting for the rider/.test(m.subject))).toHaveLength(0);
    expect((await Referral.findByPk(id))!.escalatedAt).toBeNull(); // no physio badge: the physio has not received it
  });

  it('refuses bad referral input and strangers', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    for (const body of [{}, { urgency: 'whenever', reason: 'x' }, { urgency: 'soon', reason: '' }, { urgency: 'soon', reason: '<b>x</b>' }, { urgency: 'soon', reason: 'x', attachmentIds: [999999] }]) {
      expect((await c.fitter.post(`/api/consultations/${c.consultation.id}/referrals`, body)).status).toBe(400);
    }
    const otherFitter = await signedInAs(saddlestep.app, 'fitter');
    await otherFitter.post(`/api/consultations/${c.consultation.id}/referrals`, { urgency: 'soon', reason: 'x' }).expect(404);
    expect(await Referral.count({ where: { consultationId: c.consultation.id } })).toBe(0);
  });
});
