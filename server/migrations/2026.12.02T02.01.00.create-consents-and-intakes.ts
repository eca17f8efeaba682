import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

const TABLE = { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' };

/**
 * Consents (versioned, with a hash of the exact text; withdrawable) and intakes (one open draft
 * per rider at most, submitted ones are kept as they were with the server-computed triage).
 */
export const up: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.createTable('consents', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    user_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    // A string, not an ENUM, so new kinds (share-with-physio) need no migration.
    kind: { type: DataTypes.STRING(40), allowNull: false },
    version: { type: DataTypes.STRING(20), allowNull: false },
    text_hash: { type: DataTypes.CHAR(64), allowNull: false },
    // What a scoped consent is about, e.g. ('referral', 12) for sharing with one physio.
    scope_type: { type: DataTypes.STRING(32), allowNull: true },
    scope_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    given_at: { type: DataTypes.DATE(3), allowNull: false },
    withdrawn_at: { type: DataTypes.DATE(3), allowNull: true },
  }, TABLE);
  await q.addIndex('consents', ['user_id', 'kind', 'withdrawn_at'], { name: 'consents_user_kind' });

  await q.createTable('intakes', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    rider_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    status: { type: DataTypes.ENUM('draft', 'submitted'), allowNull: false },
    symptoms: { type: DataTypes.JSON, allowNull: false },
    red_flag_answers: { type: DataTypes.JSON, allowNull: false },
    goals: { type: DataTypes.JSON, allowNull: false },
    goal_notes: { type: DataTypes.TEXT, allowNull: false },
    bike_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'bikes', key: 'id' }, onDelete: 'SET NULL' },
    triage_level: { type: DataTypes.ENUM('none', 'physio-routine', 'physio-soon', 'urgent'), allowNull: true },
    triage: { type: DataTypes.JSON, allowNull: true },
    consent_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'consents', key: 'id' }, onDelete: 'SET NULL' },
    submitted_at: { type: DataTypes.DATE(3), allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  }, TABLE);
  await q.addIndex('intakes', ['rider_id', 'status', 'submitted_at'], { name: 'intakes_rider_status' });
};

export const down: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.dropTable('intakes');
  await q.dropTable('consents');
};
