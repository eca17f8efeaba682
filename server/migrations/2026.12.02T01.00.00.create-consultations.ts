import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

const STATES = ['requested', 'awaiting_payment', 'booked', 'in_session', 'plan_active', 'on_hold', 'completed', 'cancelled', 'no_show', 'expired'];

export const up: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.createTable('consultations', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    rider_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'RESTRICT' },
    fitter_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'RESTRICT' },
    intake_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    status: { type: DataTypes.ENUM(...STATES), allowNull: false },
    starts_at: { type: DataTypes.DATE, allowNull: false },
    ends_at: { type: DataTypes.DATE, allowNull: false },
    hold_expires_at: { type: DataTypes.DATE, allowNull: true },
    fee_minor: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    currency: { type: DataTypes.CHAR(3), allowNull: false },
    calendar_uid: { type: DataTypes.STRING(80), allowNull: false },
    calendar_sequence: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    flagged_for_physio: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    cancelled_by_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    cancel_reason: { type: DataTypes.STRING(500), allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  }, { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' });
  await q.addIndex('consultations', ['fitter_id', 'starts_at'], { name: 'consultations_fitter_starts' });
  await q.addIndex('consultations', ['rider_id', 'status'], { name: 'consultations_rider_status' });
  await q.addIndex('consultations', ['status', 'hold_expires_at'], { name: 'consultations_hold_expiry' });
  await q.addIndex('consultations', ['calendar_uid'], { name: 'consultations_calendar_uid', unique: true });

  await q.createTable('consultation_events', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    consultation_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'consultations', key: 'id' }, onDelete: 'CASCADE' },
    from_status: { type: DataTypes.STRING(24), allowNull: true },
    to_status: { type: DataTypes.STRING(24), allowNull: false },
    actor_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    note: { type: DataTypes.STRING(500), allowNull: true },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
  }, { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' });
  await q.addIndex('consultation_events', ['consultation_id', 'created_at'], { name: 'consultation_events_by_consultation' });
};

export const down: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.dropTable('consultation_events');
  await q.dropTable('consultations');
};
