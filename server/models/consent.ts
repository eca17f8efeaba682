import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { ConsentKind } from '@shared/rider';

/** A consent given by a user: which text (kind, version, hash), when, and whether withdrawn. */
export class Consent extends Model<InferAttributes<Consent>, InferCreationAttributes<Consent>> {
  declare id: CreationOptional<number>;
  declare userId: number;
  declare kind: ConsentKind;
  declare version: string;
  /** SHA-256 (hex) of the exact consent text agreed to. */
  declare textHash: string;
  declare scopeType: string | null;
  declare scopeId: number | null;
  declare givenAt: Date;
  declare withdrawnAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize): typeof Consent {
    return Consent.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        kind: { type: DataTypes.STRING(40), allowNull: false },
        version: { type: DataTypes.STRING(20), allowNull: false },
        textHash: { type: DataTypes.CHAR(64), allowNull: false },
        scopeType: { type: DataTypes.STRING(32), allowNull: true },
        scopeId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        givenAt: { type: DataTypes.DATE(3), allowNull: false },
        withdrawnAt: { type: DataTypes.DATE(3), allowNull: true },
      },
      { sequelize, tableName: 'consents', timestamps: false },
    );
  }
}
