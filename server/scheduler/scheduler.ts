import { randomUUID } from 'node:crypto';
import { QueryTypes, type Sequelize } from 'sequelize';
import type { Logger } from '../logger';

export type JobHandler = (payload: Record<string, unknown>) => Promise<void>;

export interface SchedulerOptions {
  sequelize: Sequelize;
  logger: Logger;
  handlers: Record<string, JobHandler>;
  /** Work that is not a row, run on every tick (e.g. expiring slot holds). */
  periodic?: (() => Promise<unknown>)[];
  intervalMs?: number;
  instanceId?: string;
  batchSize?: number;
  /**
   * Claim only jobs with these unique keys. Tests that run a scheduler with a deliberately broken
   * part use it so they never touch jobs of test files running beside them on the same database.
   */
  onlyKeys?: string[];
}

/**
 * A running job whose claim has not been renewed for this long is assumed lost with its process and
 * retried. A live process renews the claim every HEARTBEAT_MS while the job runs, so a slow job
 * (a mail server taking minutes) is never handed to a second process while the first still works.
 */
export const STALE_AFTER_MS = 10 * 60_000;
const HEARTBEAT_MS = 60_000;
/** Batches per tick: enough for a job's follow-on jobs, bounded so a job that re-queues itself cannot spin. */
const FOLLOW_ON_ROUNDS = 4;
const MAX_ATTEMPTS = 5;

/**
 * Runs due rows of `scheduled_jobs`. Each tick claims a batch with SELECT … FOR UPDATE SKIP LOCKED
 * and marks it running in the same transaction, so several server processes can tick at once and
 * every job is claimed by exactly one of them. The claim commits before the job runs and is renewed
 * while it runs; a job is retried only if its process died mid-run (then at-least-once, documented
 * in DEVELOPERS.md). Each job sends at most one e-mail, so a retry never repeats one already sent.
 */
export function createScheduler(options: SchedulerOptions) {
  const { sequelize, logger, handlers } = options;
  const instanceId = options.instanceId ?? `scheduler-${randomUUID().slice(0, 8)}`;
  const batchSize = options.batchSize ?? 20;
  let timer: NodeJS.Timeout | null = null;
  let running: Promise<number> | null = null;

  /**
   * `now` decides which jobs are due (a tick may be run for a chosen time); staleness and the claim
   * time are always the wall clock, so a tick for a later time can never take over a job another
   * process is running right now.
   */
  async function claim(now: Date): Promise<{ id: number; kind: string; payload: unknown; attempts: number }[]> {
    const wallClock = new Date();
    return sequelize.transaction(async (transaction) => {
      await sequelize.query(
        "UPDATE scheduled_jobs SET status = 'pending', locked_by = NULL WHERE status = 'running' AND locked_at < ?",
        { replacements: [new Date(wallClock.getTime() - STALE_AFTER_MS)], transaction },
      );
      const rows = await sequelize.query<{ id: number; kind: string; payload: unknown; attempts: number }>(
        `SELECT id, kind, payload, attempts FROM scheduled_jobs WHERE status = 'pending' AND run_at <= ?${options.onlyKeys ? ' AND unique_key IN (?)' : ''} ORDER BY run_at, id LIMIT ? FOR UPDATE SKIP LOCKED`,
        { replacements: options.onlyKeys ? [now, options.onlyKeys, batchSize] : [now, batchSize], type: QueryTypes.SELECT, transaction },
      );
      if (rows.length === 0) return [];
      await sequelize.query(
        "UPDATE scheduled_jobs SET status = 'running', locked_by = ?, locked_at = ?, attempts = attempts + 1, updated_at = ? WHERE id IN (?)",
        { replacements: [instanceId, wallClock, wallClock, rows.map((r) => r.id)], transaction },
      );
      return rows;
    });
  }

  /** `clock` is the tick's time: a retry is scheduled after it, so a later round of the same tick never re-runs a failure. */
  async function finish(id: number, clock: Date, outcome: { ok: true } | { ok: false; error: string; attempts: number }) {
    const now = new Date();
    if (outcome.ok) {
      await sequelize.query("UPDATE scheduled_jobs SET status = 'done', done_at = ?, updated_at = ? WHERE id = ? AND locked_by = ?", { replacements: [now, now, id, instanceId] });
      return;
    }
    const giveUp = outcome.attempts >= MAX_ATTEMPTS;
    const retryAt = new Date(Math.max(now.getTime(), clock.getTime()) + 60_000 * 2 ** outcome.attempts);
    await sequelize.query(
      `UPDATE scheduled_jobs SET status = ?, run_at = ?, last_error = ?, locked_by = NULL, updated_at = ? WHERE id = ? AND locked_by = ?`,
      { replacements: [giveUp ? 'failed' : 'pending', retryAt, outcome.error.slice(0, 500), now, id, instanceId] },
    );
  }

  /**
   * Keep the batch's claims fresh until each job finishes (jobs later in the batch wait their turn
   * and must not look abandoned either), so no other process takes them over as stale.
   */
  function heartbeat(unfinished: Set<number>): () => void {
    const timer = setInterval(() => {
      if (unfinished.size === 0) return;
      sequelize
        .query("UPDATE scheduled_jobs SET locked_at = ? WHERE id IN (?) AND locked_by = ? AND status = 'running'", { replacements: [new Date(), [...unfinished], instanceId] })
        .catch((error: unknown) => logger.error({ err: error }, 'scheduler heartbeat failed'));
    }, HEARTBEAT_MS);
    timer.unref();
    return () => clearInterval(timer);
  }

  /**
   * One pass: periodic work, then every due job, including jobs those jobs queued for now (an
   * overdue mark queues its e-mails), up to a few rounds. Returns how many jobs ran.
   */
  async function tick(now = new Date()): Promise<number> {
    for (const task of options.periodic ?? []) await task().catch((error: unknown) => logger.error({ err: error }, 'periodic task failed'));
    let ran = 0;
    for (let round = 0; round < FOLLOW_ON_ROUNDS; round += 1) {
      // Later rounds look at the clock again, so jobs queued during this tick count as due.
      const count = await runBatch(round === 0 ? now : new Date(Math.max(now.getTime(), Date.now())));
      ran += count;
      if (count === 0) break;
    }
    return ran;
  }

  async function runBatch(now: Date): Promise<number> {
    const jobs = await claim(now);
    const unfinished = new Set(jobs.map((j) => j.id));
    const stopHeartbeat = heartbeat(unfinished);
    try {
      for (const job of jobs) {
        await runOne(job, now);
        unfinished.delete(job.id);
      }
    } finally {
      stopHeartbeat();
    }
    return jobs.length;
  }

  type ClaimedJob = Awaited<ReturnType<typeof claim>>[number];

  async function runOne(job: ClaimedJob, clock: Date) {
    const handler = handlers[job.kind];
    const payload = (typeof job.payload === 'string' ? JSON.parse(job.payload) : job.payload) as Record<string, unknown>;
    try {
      if (!handler) throw new Error(`no handler for job kind ${job.kind}`);
      await handler(payload);
      await finish(job.id, clock, { ok: true });
    } catch (error) {
      logger.error({ err: error, jobId: job.id, kind: job.kind }, 'scheduled job failed');
      await finish(job.id, clock, { ok: false, error: error instanceof Error ? error.message : String(error), attempts: job.attempts + 1 });
    }
  }

  return {
    instanceId,
    tick: (now?: Date) => {
      // Never overlap two ticks of one instance.
      running ??= tick(now).finally(() => (running = null));
      return running;
    },
    start() {
      if (timer) return;
      timer = setInterval(() => void this.tick().catch((error: unknown) => logger.error({ err: error }, 'scheduler tick failed')), options.intervalMs ?? 15_000);
      timer.unref();
    },
    async stop() {
      if (timer) clearInterval(timer);
      timer = null;
      await running?.catch(() => undefined);
    },
  };
}
export type Scheduler = ReturnType<typeof createScheduler>;
