import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createServer } from 'node:net';
import { Op } from 'sequelize';
import { currentConsent } from '@shared/rider';
import { PlanStep, Referral, ScheduledJob } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { createAppScheduler } from '@server/scheduler/app-scheduler';
import { createMailer } from '@server/mail/mailer';
import { startTestApp } from '../support/app';
import { caseOnStepOne } from '../support/care-factories';
import { waitForMails } from '../support/mail';

let saddlestep: SaddlestepApp;
beforeAll(async () => {
  saddlestep = await startTestApp();
});
afterAll(async () => {
  await saddlestep.close();
});

/** A loopback port with nothing listening: a real SMTP transport pointed there fails to connect. */
async function closedPort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
  const { port } = server.address() as { port: number };
  await new Promise<void>((resolve) => server.close(() => resolve()));
  return port;
}

/*
 * Other test files tick schedulers on the same database at the same time. These jobs are kept in
 * the year 2100 (never due for them) and this test's schedulers claim only these keys, so the
 * broken mailer never touches anyone else's jobs and nobody else runs these.
 */
const DUE = new Date('2100-01-01T00:00:00Z');
const CLOCK = new Date('2100-01-02T00:00:00Z');
const NOT_YET = new Date('2100-06-01T00:00:00Z');
const makeDue = (uniqueKey: string) => ScheduledJob.update({ runAt: DUE, status: 'pending' }, { where: { uniqueKey } });
/** Two schedulers for just these jobs: one with the real mail catcher, one whose SMTP server is down. */
async function schedulersFor(keys: string[]) {
  const dead = createMailer({ SMTP_URL: `smtp://127.0.0.1:${await closedPort()}`, MAIL_FROM: saddlestep.ctx.config.MAIL_FROM }, saddlestep.logger);
  return { dead, working: createAppScheduler(saddlestep.ctx, { onlyKeys: keys }), broken: createAppScheduler({ ...saddlestep.ctx, mailer: dead }, { onlyKeys: keys }) };
}

describe('overdue check-in e-mails', () => {
  it('sends one e-mail per job, so a failing fitter e-mail is retried without mailing the rider again', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    const step = (await PlanStep.findOne({ where: { planId: c.planId, stepIndex: 1 } }))!;
    const markKey = `checkin-overdue:${step.id}`;
    const mailKey = (to: string) => `checkin-overdue-mail:${step.id}:${to}`;
    const keys = [markKey, mailKey('rider'), mailKey('fitter')];
    // The e-mail jobs exist before the mark runs (as a second run of the mark would find them), out of other files' reach.
    for (const to of ['rider', 'fitter']) {
      await ScheduledJob.create({ kind: 'checkin-overdue-mail', uniqueKey: mailKey(to), runAt: NOT_YET, payload: { planId: c.planId, stepId: step.id, to }, status: 'pending', lockedBy: null, lockedAt: null, lastError: null, doneAt: null });
    }
    const { dead, working, broken } = await schedulersFor(keys);
    try {
      // The mark sends nothing itself and queues no second copy of the e-mail jobs.
      await makeDue(markKey);
      await broken.tick(CLOCK);
      expect((await PlanStep.findByPk(step.id))!.overdueAt).not.toBeNull();
      expect(await ScheduledJob.findOne({ where: { uniqueKey: markKey } })).toMatchObject({ status: 'done' });
      expect(await ScheduledJob.count({ where: { uniqueKey: { [Op.startsWith]: `checkin-overdue-mail:${step.id}:` } } })).toBe(2);

      // The rider's goes out; the fitter's mail server is down.
      await makeDue(mailKey('rider'));
      await working.tick(CLOCK);
      await makeDue(mailKey('fitter'));
      await broken.tick(CLOCK);
      const failed = await ScheduledJob.findOne({ where: { uniqueKey: mailKey('fitter') } });
      expect(failed).toMatchObject({ status: 'pending', attempts: 1 });
      expect(failed!.lastError).toMatch(/ECONNREFUSED|connect/i);

      // Mail is back: the fitter's job and the mark (as if re-run after a crash) are due again.
      await makeDue(mailKey('fitter'));
      await makeDue(markKey);
      await working.tick(CLOCK);
    } finally {
      dead.close();
    }
    expect(await waitForMails(c.rider.user.email, { subject: /check-in is overdue/, count: 2, timeoutMs: 1500 })).toHaveLength(1);
    expect(await waitForMails(c.fitter.user.email, { subject: /Check-in overdue/, count: 2, timeoutMs: 1500 })).toHaveLength(1);
    expect(await ScheduledJob.findOne({ where: { uniqueKey: mailKey('rider') } })).toMatchObject({ status: 'done', attempts: 1 });
    expect(await ScheduledJob.findOne({ where: { uniqueKey: mailKey('fitter') } })).toMatchObject({ status: 'done', attempts: 2 });
  }, 90_000);
});

describe('overdue referral e-mails', () => {
  it('queues one e-mail per person, so a failing physio e-mail is retried without mailing the fitter again', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    const created = await c.fitter.post(`/api/consultations/${c.consultation.id}/referrals`, { urgency: 'soon', reason: 'Knee worse', findings: '', attachmentIds: [], physioId: c.physio.user.id }).expect(201);
    const id = created.body.referral.id as number;
    const escalateKey = `referral-escalate:${id}`;
    const mailKey = (userId: number) => `referral-escalation-mail:unaccepted:${id}:${userId}`;
    // Out of other files' reach before consent queues the real check (scheduling keeps the first job).
    await ScheduledJob.create({ kind: 'referral-escalate', uniqueKey: escalateKey, runAt: NOT_YET, payload: { referralId: id }, status: 'pending', lockedBy: null, lockedAt: null, lastError: null, doneAt: null });
    for (const userId of [c.physio.user.id, c.fitter.user.id]) {
      await ScheduledJob.create({ kind: 'referral-escalation-mail', uniqueKey: mailKey(userId), runAt: NOT_YET, payload: { referralId: id, kind: 'unaccepted', userId }, status: 'pending', lockedBy: null, lockedAt: null, lastError: null, doneAt: null });
    }
    await c.rider.post(`/api/rider/referrals/${id}/consent`, { version: currentConsent('share-with-physio')!.version, agreed: true }).expect(200);

    const keys = [escalateKey, mailKey(c.physio.user.id), mailKey(c.fitter.user.id)];
    const { dead, working, broken } = await schedulersFor(keys);
    try {
      // The escalation marks the referral and sends nothing itself (the mail server is down).
      await makeDue(escalateKey);
      await broken.tick(CLOCK);
      expect((await Referral.findByPk(id))!.escalatedAt).not.toBeNull();
      expect(await ScheduledJob.findOne({ where: { uniqueKey: escalateKey } })).toMatchObject({ status: 'done' });

      await makeDue(mailKey(c.fitter.user.id));
      await working.tick(CLOCK);
      await makeDue(mailKey(c.physio.user.id));
      await broken.tick(CLOCK);
      expect(await ScheduledJob.findOne({ where: { uniqueKey: mailKey(c.physio.user.id) } })).toMatchObject({ status: 'pending', attempts: 1 });

      // Mail is back: the physio's job and the escalation (as if re-run after a crash) are due again.
      await makeDue(mailKey(c.physio.user.id));
      await makeDue(escalateKey);
      await working.tick(CLOCK);
    } finally {
      dead.close();
    }
    expect(await waitForMails(c.physio.user.email, { subject: /Overdue soon referral/, count: 2, timeoutMs: 1500 })).toHaveLength(1);
    expect(await waitForMails(c.fitter.user.email, { subject: /Overdue soon referral/, count: 2, timeoutMs: 1500 })).toHaveLength(1);
    expect(await ScheduledJob.findOne({ where: { uniqueKey: mailKey(c.fitter.user.id) } })).toMatchObject({ status: 'done', attempts: 1 });
  }, 90_000);

  it('sends nothing once the physio has accepted in the meantime', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    const created = await c.fitter.post(`/api/consultations/${c.consultation.id}/referrals`, { urgency: 'soon', reason: 'Knee worse', findings: '', attachmentIds: [], physioId: c.physio.user.id }).expect(201);
    const id = created.body.referral.id as number;
    const mailKey = `referral-escalation-mail:unaccepted:${id}:${c.physio.user.id}`;
    await ScheduledJob.create({ kind: 'referral-escalation-mail', uniqueKey: mailKey, runAt: DUE, payload: { referralId: id, kind: 'unaccepted', userId: c.physio.user.id }, status: 'pending', lockedBy: null, lockedAt: null, lastError: null, doneAt: null });
    await c.rider.post(`/api/rider/referrals/${id}/consent`, { version: currentConsent('share-with-physio')!.version, agreed: true }).expect(200);
    await c.physio.post(`/api/physio/referrals/${id}/accept`).expect(200);
    await createAppScheduler(saddlestep.ctx, { onlyKeys: [mailKey] }).tick(CLOCK);
    expect(await ScheduledJob.findOne({ where: { uniqueKey: mailKey } })).toMatchObject({ status: 'done' });
    expect(await waitForMails(c.physio.user.email, { subject: /Overdue/, timeoutMs: 800 })).toHaveLength(0);
  }, 60_000);
});
