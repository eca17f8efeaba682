import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * One row per read or write of health data, account change or sign-in. Append-only: the model
 * refuses updates and deletes, and the migration adds database triggers that refuse them too.
 */
export class AuditEntry extends Model<InferAttributes<AuditEntry>, InferCreationAttributes<AuditEntry>> {
  declare id: CreationOptional<number>;
  declare actorId: number | null;
  declare actorRole: string | null;
  /** `domain.verb`, e.g. `intake.read`, `user.approve`. */
  declare action: string;
  declare subjectType: string | null;
  declare subjectId: string | null;
  /** The rider whose health data was touched, when there is one. */
  declare subjectUserId: number | null;
  declare ip: string | null;
  declare userAgent: string | null;
  declare detail: Record<string, unknown> | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof AuditEntry {
    AuditEntry.init(
      {
        id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
        actorId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        actorRole: { type: DataTypes.STRING(16), allowNull: true },
        action: { type: DataTypes.STRING(64), allowNull: false },
        subjectType: { type: DataTypes.STRING(32), allowNull: true },
        subjectId: { type: DataTypes.STRING(64), allowNull: true },
        subjectUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        ip: { type: DataTypes.STRING(64), allowNull: true },
        userAgent: { type: DataTypes.STRING(255), allowNull: true },
        detail: { type: DataTypes.JSON, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'audit_entries', updatedAt: false },
    );
    const refuse = () => {
      throw new Error('The audit log is append-only.');
    };
    AuditEntry.addHook('beforeUpdate', refuse);
    AuditEntry.addHook('beforeBulkUpdate', refuse);
    AuditEntry.addHook('beforeDestroy', refuse);
    AuditEntry.addHook('beforeBulkDestroy', refuse);
    return AuditEntry;
  }
}
