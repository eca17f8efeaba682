import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Setup } from '@shared/fit/setup';
import type { SnapshotSource } from '@shared/rider';

/**
 * One dated record of a bike's whole setup. Append-only: a change is a new row, never an edit,
 * so the rider can always go back to any earlier setup. The model refuses updates and deletes.
 */
export class SetupSnapshot extends Model<InferAttributes<SetupSnapshot>, InferCreationAttributes<SetupSnapshot>> {
  declare id: CreationOptional<number>;
  declare bikeId: number;
  declare setup: Setup;
  declare cleatNotes: string;
  declare source: SnapshotSource;
  declare stepId: number | null;
  declare basedOnSnapshotId: number | null;
  /** YYYY-MM-DD: the day the rider measured it. */
  declare takenOn: string;
  declare createdBy: number;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof SetupSnapshot {
    SetupSnapshot.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        bikeId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        setup: { type: DataTypes.JSON, allowNull: false },
        cleatNotes: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
        source: { type: DataTypes.ENUM('baseline', 'step', 'revert', 'manual'), allowNull: false },
        stepId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        basedOnSnapshotId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        takenOn: { type: DataTypes.DATEONLY, allowNull: false },
        createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        createdAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'setup_snapshots', updatedAt: false },
    );
    const refuse = () => {
      throw new Error('Setup snapshots are append-only.');
    };
    SetupSnapshot.addHook('beforeUpdate', refuse);
    SetupSnapshot.addHook('beforeBulkUpdate', refuse);
    SetupSnapshot.addHook('beforeDestroy', refuse);
    SetupSnapshot.addHook('beforeBulkDestroy', refuse);
    return SetupSnapshot;
  }
}
