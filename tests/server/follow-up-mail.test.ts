import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createServer } from 'node:net';
import { Op, type WhereOptions } from 'sequelize';
import { PlanStep, ScheduledJob } from '@server/models';
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

const makeDue = (where: WhereOptions<ScheduledJob>) => ScheduledJob.update({ runAt: new Date(Date.now() - 1000) }, { where });

describe('overdue check-in e-mails', () => {
  it('sends one e-mail per job, so a failing fitter e-mail is retried without mailing the rider again', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    const step = (await PlanStep.findOne({ where: { planId: c.planId, stepIndex: 1 } }))!;
    const dead = createMailer({ SMTP_URL: `smtp://127.0.0.1:${await closedPort()}`, MAIL_FROM: saddlestep.ctx.config.MAIL_FROM }, saddlestep.logger);
    const working = createAppScheduler(saddlestep.ctx);
    const broken = createAppScheduler({ ...saddlestep.ctx, mailer: dead });
    const mailKey = (to: string) => `checkin-overdue-mail:${step.id}:${to}`;
    try {
      // The mark needs no e-mail and succeeds; both e-mail jobs it queued fail while mail is down.
      await makeDue({ uniqueKey: `checkin-overdue:${step.id}` });
      await broken.tick();
      expect((await PlanStep.findByPk(step.id))!.overdueAt).not.toBeNull();
      const queued = await ScheduledJob.findAll({ where: { uniqueKey: { [Op.in]: [mailKey('rider'), mailKey('fitter')] } } });
      expect(queued.map((j) => [j.status, j.attempts])).toEqual([['pending', 1], ['pending', 1]]);
      expect(queued[0]!.lastError).toMatch(/ECONNREFUSED|connect/i);

      // The rider's goes out; the fitter's fails again.
      await makeDue({ uniqueKey: mailKey('rider') });
      await working.tick();
      await makeDue({ uniqueKey: mailKey('fitter') });
      await broken.tick();
      // Mail is back: every job of this step is due again, including the mark (as if re-run after a crash).
      await ScheduledJob.update({ status: 'pending' }, { where: { uniqueKey: `checkin-overdue:${step.id}` } });
      await makeDue({ uniqueKey: { [Op.like]: `checkin-overdue%:${step.id}%` } });
      await working.tick();
    } finally {
      dead.close();
    }
    expect(await waitForMails(c.rider.user.email, { subject: /check-in is overdue/, count: 2, timeoutMs: 1500 })).toHaveLength(1);
    expect(await waitForMails(c.fitter.user.email, { subject: /Check-in overdue/, count: 2, timeoutMs: 1500 })).toHaveLength(1);
    const fitterJob = await ScheduledJob.findOne({ where: { uniqueKey: mailKey('fitter') } });
    expect(fitterJob).toMatchObject({ status: 'done', attempts: 3 });
  }, 90_000);
});
