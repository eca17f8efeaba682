import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

/**
 * Refunds become a retried job: a row is written as `pending` in the same transaction as its cause
 * (a cancellation, an admin's refund, a charge we cannot honour) and settled when Stripe answers.
 * `notice` says which e-mail goes out once it succeeds; `notice_sent_at` makes that e-mail go once.
 * Rows from before this migration were written only after Stripe succeeded, hence the defaults.
 */
export const up: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.addColumn('refunds', 'status', { type: DataTypes.ENUM('pending', 'succeeded', 'failed'), allowNull: false, defaultValue: 'succeeded' });
  await q.addColumn('refunds', 'notice', { type: DataTypes.ENUM('none', 'cancellation', 'refund'), allowNull: false, defaultValue: 'none' });
  await q.addColumn('refunds', 'last_error', { type: DataTypes.STRING(300), allowNull: true });
  await q.addColumn('refunds', 'settled_at', { type: DataTypes.DATE, allowNull: true });
  await q.addColumn('refunds', 'notice_sent_at', { type: DataTypes.DATE, allowNull: true });
  await q.addIndex('refunds', ['payment_id', 'status'], { name: 'refunds_payment_status' });
};

export const down: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.removeIndex('refunds', 'refunds_payment_status');
  for (const column of ['notice_sent_at', 'settled_at', 'last_error', 'notice', 'status']) await q.removeColumn('refunds', column);
};
