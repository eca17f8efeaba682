import { Op, type Transaction } from 'sequelize';
import { ScheduledJob } from '../models';

export interface JobSpec {
  kind: string;
  /** One job per key: scheduling the same key twice keeps the first. */
  uniqueKey: string;
  runAt: Date;
  payload: Record<string, unknown>;
}

/** Add a job unless one with the same key exists (idempotent, so retries never double-send). */
export async function scheduleJob(spec: JobSpec, options: { transaction?: Transaction } = {}): Promise<void> {
  await ScheduledJob.findOrCreate({
    where: { uniqueKey: spec.uniqueKey },
    defaults: { ...spec, status: 'pending', lockedBy: null, lockedAt: null, lastError: null, doneAt: null },
    transaction: options.transaction,
  });
}

/** Cancel pending jobs of a kind whose key starts with `keyPrefix` (e.g. every reminder of one booking). */
export async function cancelPendingJobs(kind: string, keyPrefix: string, options: { transaction?: Transaction } = {}): Promise<number> {
  const [count] = await ScheduledJob.update(
    { status: 'cancelled' },
    { where: { kind, status: 'pending', uniqueKey: { [Op.startsWith]: keyPrefix } }, transaction: options.transaction },
  );
  return count;
}
