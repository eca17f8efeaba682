import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

/**
 * Refunds the studio must look at, and the admin's Try again:
 * - `attempts` counts the times Stripe was asked, so the admin screen can say how hard we tried;
 * - `admin_retries` says an admin re-queued the refund (then Stripe is asked what it already made
 *   before sending again, because its idempotency keys expire after 24 h);
 * - `retry_key` is the last Try again's attempt id, so a double click re-queues once.
 * `status` is indexed because the attention list reads failed and pending rows of every payment.
 */
export const up: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.addColumn('refunds', 'attempts', { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 });
  await q.addColumn('refunds', 'admin_retries', { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 });
  await q.addColumn('refunds', 'retry_key', { type: DataTypes.STRING(36), allowNull: true });
  await q.addIndex('refunds', ['status'], { name: 'refunds_status' });
};

export const down: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.removeIndex('refunds', 'refunds_status');
  for (const column of ['retry_key', 'admin_retries', 'attempts']) await q.removeColumn('refunds', column);
};
