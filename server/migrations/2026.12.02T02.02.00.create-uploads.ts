import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

/**
 * Photos and clips. The files live under UPLOAD_DIR with random names; this table is the only
 * way to find them, and holds no original file name (names can carry places and dates).
 */
export const up: Migration = async ({ sequelize }) => {
  const q = sequelize.getQueryInterface();
  await q.createTable('uploads', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    rider_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    intake_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'intakes', key: 'id' }, onDelete: 'CASCADE' },
    view: { type: DataTypes.STRING(24), allowNull: false },
    kind: { type: DataTypes.ENUM('photo', 'clip'), allowNull: false },
    content_type: { type: DataTypes.STRING(40), allowNull: false },
    byte_size: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    width: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    height: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    storage_name: { type: DataTypes.STRING(80), allowNull: false },
    thumbnail_name: { type: DataTypes.STRING(80), allowNull: true },
    metadata_stripped: { type: DataTypes.BOOLEAN, allowNull: false },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
  }, { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' });
  await q.addIndex('uploads', ['intake_id'], { name: 'uploads_intake' });
  await q.addIndex('uploads', ['rider_id', 'created_at'], { name: 'uploads_rider' });
  await q.addIndex('uploads', ['storage_name'], { name: 'uploads_storage_name', unique: true });
};

export const down: Migration = async ({ sequelize }) => {
  await sequelize.getQueryInterface().dropTable('uploads');
};
