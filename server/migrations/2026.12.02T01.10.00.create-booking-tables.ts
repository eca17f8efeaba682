import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

const table = { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' };
const userRef = { model: 'users', key: 'id' };

/** Fitter profiles with availability, payments and refunds, Stripe events, scheduled jobs, clinic settings. */
export const up: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.createTable('fitter_profiles', {
    user_id: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true, references: userRef, onDelete: 'CASCADE' },
    bio: { type: DataTypes.TEXT, allowNull: false },
    specialties: { type: DataTypes.JSON, allowNull: false },
    languages: { type: DataTypes.JSON, allowNull: false },
    fee_minor: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    currency: { type: DataTypes.CHAR(3), allowNull: false },
    published: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    availability: { type: DataTypes.JSON, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  }, table);

  await q.createTable('payment_customers', {
    user_id: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true, references: userRef, onDelete: 'CASCADE' },
    stripe_customer_id: { type: DataTypes.STRING(64), allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
  }, table);

  await q.createTable('payments', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    consultation_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'consultations', key: 'id' }, onDelete: 'RESTRICT' },
    // Nullable so a deleted rider leaves an anonymised payment record behind.
    rider_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    attempt_key: { type: DataTypes.STRING(80), allowNull: false, unique: true },
    stripe_customer_id: { type: DataTypes.STRING(64), allowNull: true },
    stripe_charge_id: { type: DataTypes.STRING(64), allowNull: true },
    amount_minor: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    currency: { type: DataTypes.CHAR(3), allowNull: false },
    status: { type: DataTypes.ENUM('pending', 'succeeded', 'failed', 'refunded', 'partially_refunded'), allowNull: false },
    refunded_minor: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    failure_message: { type: DataTypes.STRING(300), allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  }, table);
  await q.addIndex('payments', ['consultation_id', 'status'], { name: 'payments_consultation_status' });
  await q.addIndex('payments', ['stripe_charge_id'], { name: 'payments_charge' });

  await q.createTable('refunds', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    payment_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'payments', key: 'id' }, onDelete: 'RESTRICT' },
    idempotency_key: { type: DataTypes.STRING(80), allowNull: false, unique: true },
    stripe_refund_id: { type: DataTypes.STRING(64), allowNull: true },
    amount_minor: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    reason: { type: DataTypes.STRING(300), allowNull: false },
    actor_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
  }, table);

  await q.createTable('stripe_events', {
    id: { type: DataTypes.STRING(80), primaryKey: true },
    type: { type: DataTypes.STRING(80), allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
  }, table);

  await q.createTable('scheduled_jobs', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    kind: { type: DataTypes.STRING(48), allowNull: false },
    // e.g. `booking-reminder:12:0`; one job per key, so scheduling twice cannot send twice.
    unique_key: { type: DataTypes.STRING(120), allowNull: false, unique: true },
    run_at: { type: DataTypes.DATE, allowNull: false },
    payload: { type: DataTypes.JSON, allowNull: false },
    status: { type: DataTypes.ENUM('pending', 'running', 'done', 'cancelled', 'failed'), allowNull: false },
    attempts: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    locked_by: { type: DataTypes.STRING(80), allowNull: true },
    locked_at: { type: DataTypes.DATE, allowNull: true },
    last_error: { type: DataTypes.STRING(500), allowNull: true },
    done_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  }, table);
  await q.addIndex('scheduled_jobs', ['status', 'run_at'], { name: 'scheduled_jobs_due' });

  await q.createTable('clinic_settings', {
    id: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
    settings: { type: DataTypes.JSON, allowNull: false },
    updated_by_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  }, table);
};

export const down: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  for (const name of ['clinic_settings', 'scheduled_jobs', 'stripe_events', 'refunds', 'payments', 'payment_customers', 'fitter_profiles']) await q.dropTable(name);
};
