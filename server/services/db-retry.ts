import { Transaction } from 'sequelize';
import type { AppContext } from '../context';

/** MariaDB's deadlock (1213) and lock wait timeout (1205): the statement or transaction was rolled back and may simply run again. */
export function isLockRetryable(error: unknown): boolean {
  const errno = (error as { parent?: { errno?: number }; original?: { errno?: number } } | null)?.parent?.errno ?? (error as { original?: { errno?: number } } | null)?.original?.errno;
  return errno === 1213 || errno === 1205;
}

/**
 * Run `work` in a READ COMMITTED transaction (no gap locks on plain index scans, so payment and
 * refund writes do not deadlock with the scheduler's job rows), or inside `outer` when the caller
 * already has one. A deadlock rolls our own transaction back whole, so it is retried a few times
 * instead of turning a charged payment into a 500.
 */
export async function inTransaction<T>(ctx: Pick<AppContext, 'sequelize'>, outer: Transaction | undefined, work: (transaction: Transaction) => Promise<T>): Promise<T> {
  if (outer) return work(outer);
  for (let attempt = 1; ; attempt += 1) {
    try {
      return await ctx.sequelize.transaction({ isolationLevel: Transaction.ISOLATION_LEVELS.READ_COMMITTED }, work);
    } catch (error) {
      if (attempt >= 4 || !isLockRetryable(error)) throw error;
      await new Promise((resolve) => setTimeout(resolve, 25 * attempt + Math.random() * 50));
    }
  }
}
