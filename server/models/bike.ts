import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { BikeKind } from '@shared/rider';

/** A rider's bike. Retiring hides it but keeps its setup history. */
export class Bike extends Model<InferAttributes<Bike>, InferCreationAttributes<Bike>> {
  declare id: CreationOptional<number>;
  declare riderId: number;
  declare name: string;
  declare kind: BikeKind;
  declare notes: string;
  declare retiredAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof Bike {
    return Bike.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        riderId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        name: { type: DataTypes.STRING(60), allowNull: false },
        kind: { type: DataTypes.STRING(24), allowNull: false },
        notes: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
        retiredAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'bikes' },
    );
  }
}
