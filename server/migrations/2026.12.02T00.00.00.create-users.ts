import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

export const up: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.createTable('users', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    email: { type: DataTypes.STRING(254), allowNull: false },
    password_hash: { type: DataTypes.STRING(100), allowNull: false },
    role: { type: DataTypes.ENUM('rider', 'fitter', 'physio', 'admin'), allowNull: false },
    display_name: { type: DataTypes.STRING(80), allowNull: false },
    time_zone: { type: DataTypes.STRING(64), allowNull: false },
    status: { type: DataTypes.ENUM('active', 'pending', 'disabled', 'rejected'), allowNull: false },
    approved_at: { type: DataTypes.DATE, allowNull: true },
    approved_by_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    last_sign_in_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  }, { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' });
  await q.addIndex('users', ['email'], { unique: true, name: 'users_email_unique' });
  await q.addIndex('users', ['role', 'status'], { name: 'users_role_status' });
};

export const down: Migration = async ({ sequelize }) => {
  await sequelize.getQueryInterface().dropTable('users');
};
