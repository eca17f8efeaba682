import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** One row (id 1) holding the clinic policy as JSON, validated by clinicSettingsSchema on every write. */
export class ClinicSettings extends Model<InferAttributes<ClinicSettings>, InferCreationAttributes<ClinicSettings>> {
  declare id: number;
  declare settings: unknown;
  declare updatedById: number | null;
  declare updatedAt: Date;

  static initModel(sequelize: Sequelize): typeof ClinicSettings {
    return ClinicSettings.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
        settings: { type: DataTypes.JSON, allowNull: false },
        updatedById: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'clinic_settings', createdAt: false },
    );
  }
}
