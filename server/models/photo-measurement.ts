import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { PhotoMeasurement as Result, PhotoMeasurementInput } from '@shared/fit/photo';

/** Points a fitter marked on a photo, with the server's own computation of the angles. */
export class PhotoMeasurement extends Model<InferAttributes<PhotoMeasurement>, InferCreationAttributes<PhotoMeasurement>> {
  declare id: CreationOptional<number>;
  declare uploadId: number;
  declare consultationId: number;
  declare createdBy: number;
  declare input: PhotoMeasurementInput;
  declare result: Result;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof PhotoMeasurement {
    return PhotoMeasurement.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        uploadId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        consultationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        input: { type: DataTypes.JSON, allowNull: false },
        result: { type: DataTypes.JSON, allowNull: false },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'photo_measurements', updatedAt: false },
    );
  }
}
