import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const JOB_STATUSES = ['pending', 'running', 'done', 'cancelled', 'failed'] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];

/** A job the in-process scheduler runs once at `runAt` (claimed with row locks; see server/scheduler). */
export class ScheduledJob extends Model<InferAttributes<ScheduledJob>, InferCreationAttributes<ScheduledJob>> {
  declare id: CreationOptional<number>;
  declare kind: string;
  declare uniqueKey: string;
  declare runAt: Date;
  declare payload: Record<string, unknown>;
  declare status: JobStatus;
  declare attempts: CreationOptional<number>;
  declare lockedBy: string | null;
  declare lockedAt: Date | null;
  declare lastError: string | null;
  declare doneAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof ScheduledJob {
    return ScheduledJob.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        kind: { type: DataTypes.STRING(48), allowNull: false },
        uniqueKey: { type: DataTypes.STRING(120), allowNull: false, unique: true },
        runAt: { type: DataTypes.DATE, allowNull: false },
        payload: { type: DataTypes.JSON, allowNull: false },
        status: { type: DataTypes.ENUM(...JOB_STATUSES), allowNull: false },
        attempts: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
        lockedBy: { type: DataTypes.STRING(80), allowNull: true },
        lockedAt: { type: DataTypes.DATE, allowNull: true },
        lastError: { type: DataTypes.STRING(500), allowNull: true },
        doneAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'scheduled_jobs' },
    );
  }
}
