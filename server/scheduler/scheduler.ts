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
}

/** A running job not finished within this time is assumed lost with its process and retried. */
const STALE_AFTER_MS = 10 * 60_000;
const MAX_ATTEMPTS = 5;

/**
 * Runs due rows of `scheduled_jobs`. Each tick claims a batch with SELECT … FOR UPDATE SKIP LOCKED
 * and marks it running in the same transaction, so several server processes can tick at once and
 * every job is claimed by exactly one of them. The claim commits before the job runs; a job is
 * retried only if its process died mid-run (then at-least-once, documented in DEVELOPERS.md).
 */
export function createScheduler(options: SchedulerOptions) {
  const { sequelize, logger, handlers } = options;
  const instanceId = options.instanceId ?? `scheduler-${randomUUID().slice(0, 8)}`;
  const batchSize = options.batchSize ?? 20;
  let timer: NodeJS.Timeout | null = null;
  let running: Promise<number> | null = null;

  async function claim(now: Date): Promise<{ id: number; kind: string; payload: unknown; attempts: number }[]> {
    return sequelize.transaction(async (transaction) => {
      await sequelize.query(
        "UPDATE scheduled_jobs SET status = 'pending', locked_by = NULL WHERE status = 'running' AND locked_at < ?",
        { replacements: [new Date(now.getTime() - STALE_AFTER_MS)], transaction },
      );
      const rows = await sequelize.query<{ id: number; kind: string; payload: unknown; attempts: number }>(
        "SELECT id, kind, payload, attempts FROM scheduled_jobs WHERE status = 'pending' AND run_at <= ? ORDER BY run_at, id LIMIT ? FOR UPDATE SKIP LOCKED",
        { replacements: [now, batchSize], type: QueryTypes.SELECT, transaction },
      );
      if (rows.length === 0) return [];
      await sequelize.query(
        "UPDATE scheduled_jobs SET status = 'running', locked_by = ?, locked_at = ?, attempts = attempts + 1, updated_at = ? WHERE id IN (?)",
        { replacements: [instanceId, now, now, rows.map((r) => r.id)], transaction },
      );
      return rows;
    });
  }

  async function finish(id: number, outcome: { ok: true } | { ok: false; error: string; attempts: number }) {
    const now = new Date();
    if (outcome.ok) {
      await sequelize.query("UPDATE scheduled_jobs SET status = 'done', done_at = ?, updated_at = ? WHERE id = ? AND locked_by = ?", { replacements: [now, now, id, instanceId] });
      return;
    }
    const giveUp = outcome.attempts >= MAX_ATTEMPTS;
    const retryAt = new Date(now.getTime() + 60_000 * 2 ** outcome.attempts);
    await sequelize.query(
      `UPDATE scheduled_jobs SET status = ?, run_at = ?, last_error = ?, locked_by = NULL, updated_at = ? WHERE id = ? AND locked_by = ?`,
      { replacements: [giveUp ? 'failed' : 'pending', retryAt, outcome.error.slice(0, 500), now, id, instanceId] },
    );
  }

  /** One pass: periodic work, then every due job. Returns how many jobs ran. */
  async function tick(now = new Date()): Promise<number> {
    for (const task of options.periodic ?? []) await task().catch((error: unknown) => logger.error({ err: error }, 'periodic task failed'));
    const jobs = await claim(now);
    for (const job of jobs) {
      const handler = handlers[job.kind];
      const payload = (typeof job.payload === 'string' ? JSON.parse(job.payload) : job.payload) as Record<string, unknown>;
      try {
        if (!handler) throw new Error(`no handler for job kind ${job.kind}`);
        await handler(payload);
        await finish(job.id, { ok: true });
      } catch (error) {
        logger.error({ err: error, jobId: job.id, kind: job.kind }, 'scheduled job failed');
        await finish(job.id, { ok: false, error: error instanceof Error ? error.message : String(error), attempts: job.attempts + 1 });
      }
    }
    return jobs.length;
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
