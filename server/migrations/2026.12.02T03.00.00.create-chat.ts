import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

const table = { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' };

/** Chat: messages with a per-consultation sequence, and each participant's delivered/read cursor. */
export const up: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.addColumn('consultations', 'last_message_seq', { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 });
  await q.createTable('messages', {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
    consultation_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'consultations', key: 'id' }, onDelete: 'CASCADE' },
    seq: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    client_id: { type: DataTypes.CHAR(36), allowNull: false },
    sender_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    kind: { type: DataTypes.ENUM('text', 'plan', 'system'), allowNull: false },
    body: { type: DataTypes.TEXT, allowNull: false },
    attachment_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    plan_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
  }, table);
  await q.addIndex('messages', ['consultation_id', 'seq'], { unique: true, name: 'messages_consultation_seq' });
  await q.addIndex('messages', ['consultation_id', 'client_id'], { unique: true, name: 'messages_consultation_client' });

  await q.createTable('chat_cursors', {
    consultation_id: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true, references: { model: 'consultations', key: 'id' }, onDelete: 'CASCADE' },
    user_id: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
    delivered_seq: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    read_seq: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  }, table);
};

export const down: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.dropTable('chat_cursors');
  await q.dropTable('messages');
  await q.removeColumn('consultations', 'last_message_seq');
};
