import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

const TABLE = { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' };

/**
 * Rider profiles (one row per rider), bikes, and the append-only setup history. Lengths are
 * millimetres (DOUBLE, rounded to 0.1 mm by the API); setups are JSON in the shared Setup shape.
 */
export const up: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.createTable('rider_profiles', {
    user_id: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    unit_preference: { type: DataTypes.ENUM('mm', 'in'), allowNull: false, defaultValue: 'mm' },
    height_mm: { type: DataTypes.DOUBLE, allowNull: true },
    inseam_mm: { type: DataTypes.DOUBLE, allowNull: true },
    birth_year: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: true },
    flexibility: { type: DataTypes.STRING(16), allowNull: true },
    riding_style: { type: DataTypes.STRING(24), allowNull: true },
    hours_per_week: { type: DataTypes.DOUBLE, allowNull: true },
    rides_per_week: { type: DataTypes.TINYINT.UNSIGNED, allowNull: true },
    injury_history: { type: DataTypes.TEXT, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  }, TABLE);

  await q.createTable('bikes', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    rider_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    name: { type: DataTypes.STRING(60), allowNull: false },
    kind: { type: DataTypes.STRING(24), allowNull: false },
    notes: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
    // Retired bikes leave the lists but keep their setup history (plans may point at it).
    retired_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  }, TABLE);
  await q.addIndex('bikes', ['rider_id', 'retired_at'], { name: 'bikes_rider' });

  await q.createTable('setup_snapshots', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    bike_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'bikes', key: 'id' }, onDelete: 'CASCADE' },
    setup: { type: DataTypes.JSON, allowNull: false },
    cleat_notes: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
    source: { type: DataTypes.ENUM('baseline', 'step', 'revert', 'manual'), allowNull: false },
    // The plan step applied (issue 5); no foreign key yet because plan steps do not exist yet.
    step_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    // For 'revert': the earlier snapshot the rider went back to.
    based_on_snapshot_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'setup_snapshots', key: 'id' }, onDelete: 'SET NULL' },
    taken_on: { type: DataTypes.DATEONLY, allowNull: false },
    created_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
  }, TABLE);
  await q.addIndex('setup_snapshots', ['bike_id', 'id'], { name: 'setup_snapshots_bike' });
};

export const down: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.dropTable('setup_snapshots');
  await q.dropTable('bikes');
  await q.dropTable('rider_profiles');
};
