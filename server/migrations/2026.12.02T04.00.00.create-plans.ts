import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

const table = { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' };
const consultationRef = { model: 'consultations', key: 'id' };

/** Plans and their steps, private fitter notes, and photo measurements. */
export const up: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.createTable('plans', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    consultation_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: consultationRef, onDelete: 'CASCADE' },
    rider_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    fitter_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    bike_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'bikes', key: 'id' }, onDelete: 'CASCADE' },
    kind: { type: DataTypes.ENUM('forward', 'revert'), allowNull: false },
    status: { type: DataTypes.ENUM('active', 'on_hold', 'superseded', 'completed'), allowNull: false },
    plan: { type: DataTypes.JSON, allowNull: false },
    inputs: { type: DataTypes.JSON, allowNull: false },
    hold_reason: { type: DataTypes.STRING(500), allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  }, table);
  await q.addIndex('plans', ['rider_id', 'status'], { name: 'plans_rider_status' });
  await q.addIndex('plans', ['consultation_id'], { name: 'plans_consultation' });

  await q.createTable('plan_steps', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    plan_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'plans', key: 'id' }, onDelete: 'CASCADE' },
    step_index: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    state: { type: DataTypes.ENUM('locked', 'current', 'applied'), allowNull: false },
    earliest_date: { type: DataTypes.DATEONLY, allowNull: false },
    min_rides: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    applied_on: { type: DataTypes.DATEONLY, allowNull: true },
    check_in_due: { type: DataTypes.DATEONLY, allowNull: true },
    checked_in_at: { type: DataTypes.DATE, allowNull: true },
    overdue_at: { type: DataTypes.DATE, allowNull: true },
    snapshot_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  }, table);
  await q.addIndex('plan_steps', ['plan_id', 'step_index'], { unique: true, name: 'plan_steps_plan_index' });
  await q.addIndex('plan_steps', ['state', 'check_in_due'], { name: 'plan_steps_due' });

  await q.createTable('fitter_notes', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    consultation_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: consultationRef, onDelete: 'CASCADE' },
    fitter_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    body: { type: DataTypes.TEXT, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  }, table);

  await q.createTable('photo_measurements', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    upload_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'uploads', key: 'id' }, onDelete: 'CASCADE' },
    consultation_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: consultationRef, onDelete: 'CASCADE' },
    created_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    input: { type: DataTypes.JSON, allowNull: false },
    result: { type: DataTypes.JSON, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
  }, table);
  await q.addIndex('photo_measurements', ['upload_id', 'created_at'], { name: 'photo_measurements_upload' });
};

export const down: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  for (const name of ['photo_measurements', 'fitter_notes', 'plan_steps', 'plans']) await q.dropTable(name);
};
