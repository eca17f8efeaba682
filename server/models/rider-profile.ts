import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { LengthUnit } from '@shared/units';
import type { Flexibility, RidingStyle } from '@shared/rider';

/** One per rider: body measurements in millimetres, riding habits, injury history (health data). */
export class RiderProfile extends Model<InferAttributes<RiderProfile>, InferCreationAttributes<RiderProfile>> {
  declare userId: number;
  declare unitPreference: CreationOptional<LengthUnit>;
  declare heightMm: number | null;
  declare inseamMm: number | null;
  declare birthYear: number | null;
  declare flexibility: Flexibility | null;
  declare ridingStyle: RidingStyle | null;
  declare hoursPerWeek: number | null;
  declare ridesPerWeek: number | null;
  declare injuryHistory: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof RiderProfile {
    return RiderProfile.init(
      {
        userId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
        unitPreference: { type: DataTypes.ENUM('mm', 'in'), allowNull: false, defaultValue: 'mm' },
        heightMm: { type: DataTypes.DOUBLE, allowNull: true },
        inseamMm: { type: DataTypes.DOUBLE, allowNull: true },
        birthYear: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: true },
        flexibility: { type: DataTypes.STRING(16), allowNull: true },
        ridingStyle: { type: DataTypes.STRING(24), allowNull: true },
        hoursPerWeek: { type: DataTypes.DOUBLE, allowNull: true },
        ridesPerWeek: { type: DataTypes.TINYINT.UNSIGNED, allowNull: true },
        injuryHistory: { type: DataTypes.TEXT, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'rider_profiles' },
    );
  }
}
