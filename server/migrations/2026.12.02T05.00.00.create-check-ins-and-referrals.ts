import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

const table = { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' };

/** Comfort check-ins after each step, and referrals to a physiotherapist. */
export const up: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.createTable('check_ins', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    plan_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'plans', key: 'id' }, onDelete: 'CASCADE' },
    step_index: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    rider_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    rides: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    minutes_ridden: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    comfort: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false },
    pains: { type: DataTypes.JSON, allowNull: false },
    numbness: { type: DataTypes.BOOLEAN, allowNull: false },
    note: { type: DataTypes.TEXT, allowNull: false },
    red_flag_answers: { type: DataTypes.JSON, allowNull: false },
    analysis: { type: DataTypes.JSON, allowNull: false },
    decision: { type: DataTypes.STRING(24), allowNull: false },
    reviewed_at: { type: DataTypes.DATE, allowNull: true },
    reviewed_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
  }, table);
  await q.addIndex('check_ins', ['plan_id', 'step_index'], { name: 'check_ins_plan_step' });
  await q.addIndex('check_ins', ['rider_id', 'created_at'], { name: 'check_ins_rider' });

  await q.createTable('referrals', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    consultation_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'consultations', key: 'id' }, onDelete: 'CASCADE' },
    rider_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    fitter_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    physio_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    origin: { type: DataTypes.ENUM('fitter', 'system', 'red-flag'), allowNull: false },
    urgency: { type: DataTypes.ENUM('routine', 'soon', 'urgent'), allowNull: false },
    status: { type: DataTypes.ENUM('proposed', 'awaiting_consent', 'sent', 'received', 'accepted', 'declined', 'in_progress', 'closed', 'withdrawn'), allowNull: false },
    reason: { type: DataTypes.TEXT, allowNull: false },
    findings: { type: DataTypes.TEXT, allowNull: false },
    attachment_ids: { type: DataTypes.JSON, allowNull: false },
    consent_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    decision: { type: DataTypes.STRING(24), allowNull: true },
    response_note: { type: DataTypes.TEXT, allowNull: true },
    limits: { type: DataTypes.JSON, allowNull: true },
    hold_reason: { type: DataTypes.STRING(500), allowNull: true },
    decline_note: { type: DataTypes.STRING(1000), allowNull: true },
    sent_at: { type: DataTypes.DATE, allowNull: true },
    received_at: { type: DataTypes.DATE, allowNull: true },
    accepted_at: { type: DataTypes.DATE, allowNull: true },
    closed_at: { type: DataTypes.DATE, allowNull: true },
    escalated_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  }, table);
  await q.addIndex('referrals', ['physio_id', 'status'], { name: 'referrals_physio_status' });
  await q.addIndex('referrals', ['rider_id', 'status'], { name: 'referrals_rider_status' });
  await q.addIndex('referrals', ['consultation_id'], { name: 'referrals_consultation' });
};

export const down: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.dropTable('referrals');
  await q.dropTable('check_ins');
};
