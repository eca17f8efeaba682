import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

/**
 * The audit table is append-only. Besides the model hooks, triggers make the database itself
 * refuse UPDATE and DELETE, so no code path in the app can rewrite history.
 */
export const up: Migration = async ({ sequelize, logger }) => {
  const q = sequelize.getQueryInterface();
  await q.createTable('audit_entries', {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
    actor_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    actor_role: { type: DataTypes.STRING(16), allowNull: true },
    action: { type: DataTypes.STRING(64), allowNull: false },
    subject_type: { type: DataTypes.STRING(32), allowNull: true },
    subject_id: { type: DataTypes.STRING(64), allowNull: true },
    subject_user_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    ip: { type: DataTypes.STRING(64), allowNull: true },
    user_agent: { type: DataTypes.STRING(255), allowNull: true },
    detail: { type: DataTypes.JSON, allowNull: true },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
  }, { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' });
  await q.addIndex('audit_entries', ['created_at'], { name: 'audit_entries_created_at' });
  await q.addIndex('audit_entries', ['subject_user_id', 'created_at'], { name: 'audit_entries_subject_user' });
  await q.addIndex('audit_entries', ['actor_id', 'created_at'], { name: 'audit_entries_actor' });
  try {
    await sequelize.query(
      `CREATE TRIGGER audit_entries_no_update BEFORE UPDATE ON audit_entries FOR EACH ROW
       SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'audit_entries is append-only'`,
    );
    await sequelize.query(
      `CREATE TRIGGER audit_entries_no_delete BEFORE DELETE ON audit_entries FOR EACH ROW
       SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'audit_entries is append-only'`,
    );
  } catch (error) {
    // Some managed databases with binary logging refuse CREATE TRIGGER without extra privileges.
    // The model hooks still refuse changes; the operator is told how to add the database guard.
    logger?.warn({ err: error }, 'Could not create the audit triggers; grant TRIGGER (and log_bin_trust_function_creators) and re-run this migration.');
  }
};

export const down: Migration = async ({ sequelize }) => {
  await sequelize.query('DROP TRIGGER IF EXISTS audit_entries_no_update');
  await sequelize.query('DROP TRIGGER IF EXISTS audit_entries_no_delete');
  await sequelize.getQueryInterface().dropTable('audit_entries');
};
