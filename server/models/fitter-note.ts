import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A fitter's private note on a consultation. Never presented to the rider. */
export class FitterNote extends Model<InferAttributes<FitterNote>, InferCreationAttributes<FitterNote>> {
  declare id: CreationOptional<number>;
  declare consultationId: number;
  declare fitterId: number;
  declare body: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof FitterNote {
    return FitterNote.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        consultationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        fitterId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        body: { type: DataTypes.TEXT, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'fitter_notes' },
    );
  }
}
