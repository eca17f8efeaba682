import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { ScheduledJob } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { createAppScheduler } from '@server/scheduler/app-scheduler';
import { STALE_AFTER_MS } from '@server/scheduler/scheduler';
import { startTestApp } from '../support/app';

/**
 * A tick may be run for a chosen time (tests do, to reach a reminder's hour). Whether a running job
 * looks abandoned is still judged by the wall clock, so such a tick never takes over a job another
 * process is running right now: that would send its e-mail twice.
 */
let saddlestep: SaddlestepApp;
beforeAll(async () => {
  saddlestep = await startTestApp();
});
afterAll(async () => {
  await saddlestep?.close();
});

async function runningJob(lockedAt: Date) {
  const uniqueKey = `claim-test:${randomUUID()}`;
  // A kind with no handler: if this scheduler ever ran it, the job would be marked as failed.
  await ScheduledJob.create({ kind: 'claim-test', uniqueKey, runAt: new Date(Date.now() - 60_000), payload: {}, status: 'running', lockedBy: 'another-process', lockedAt, lastError: null, doneAt: null });
  return uniqueKey;
}

describe('claiming scheduled jobs', () => {
  it('leaves a job another process is running alone, even for a tick a year ahead', async () => {
    const uniqueKey = await runningJob(new Date());
    const yearAhead = new Date(Date.now() + 365 * 86_400_000);
    await createAppScheduler(saddlestep.ctx, { onlyKeys: [uniqueKey] }).tick(yearAhead);
    expect(await ScheduledJob.findOne({ where: { uniqueKey } })).toMatchObject({ status: 'running', lockedBy: 'another-process' });
  });

  it('takes over a job whose claim has not been renewed for the stale period', async () => {
    const uniqueKey = await runningJob(new Date(Date.now() - STALE_AFTER_MS - 60_000));
    await createAppScheduler(saddlestep.ctx, { onlyKeys: [uniqueKey] }).tick();
    const job = await ScheduledJob.findOne({ where: { uniqueKey } });
    expect(job?.lockedBy).not.toBe('another-process');
    expect(job?.lastError).toMatch(/no handler/);
  });
});
