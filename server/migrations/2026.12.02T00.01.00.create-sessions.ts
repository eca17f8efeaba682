import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

export const up: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.createTable('sessions', {
    sid: { type: DataTypes.STRING(64), primaryKey: true },
    expires: { type: DataTypes.DATE, allowNull: true },
    data: { type: DataTypes.TEXT('medium'), allowNull: true },
    user_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: 'users', key: 'id' },
      onDelete: 'CASCADE',
    },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  }, { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' });
  await q.addIndex('sessions', ['expires'], { name: 'sessions_expires' });
  await q.addIndex('sessions', ['user_id'], { name: 'sessions_user_id' });
};

export const down: Migration = async ({ sequelize }) => {
  await sequelize.getQueryInterface().dropTable('sessions');
};
