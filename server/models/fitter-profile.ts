import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Availability } from '@shared/booking';

/** What riders see of a fitter, and the fitter's bookable week (validated by availabilitySchema). */
export class FitterProfile extends Model<InferAttributes<FitterProfile>, InferCreationAttributes<FitterProfile>> {
  declare userId: number;
  declare bio: string;
  declare specialties: string[];
  declare languages: string[];
  declare feeMinor: number;
  declare currency: string;
  declare published: boolean;
  declare availability: Availability;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof FitterProfile {
    return FitterProfile.init(
      {
        userId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
        bio: { type: DataTypes.TEXT, allowNull: false },
        specialties: { type: DataTypes.JSON, allowNull: false },
        languages: { type: DataTypes.JSON, allowNull: false },
        feeMinor: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        currency: { type: DataTypes.CHAR(3), allowNull: false },
        published: { type: DataTypes.BOOLEAN, allowNull: false },
        availability: { type: DataTypes.JSON, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'fitter_profiles' },
    );
  }
}
