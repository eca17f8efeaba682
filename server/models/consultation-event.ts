import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** One recorded state change of a consultation: from, to, who, when, why. */
export class ConsultationEvent extends Model<InferAttributes<ConsultationEvent>, InferCreationAttributes<ConsultationEvent>> {
  declare id: CreationOptional<number>;
  declare consultationId: number;
  declare fromStatus: string | null;
  declare toStatus: string;
  declare actorId: number | null;
  declare note: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof ConsultationEvent {
    return ConsultationEvent.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        consultationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        fromStatus: { type: DataTypes.STRING(24), allowNull: true },
        toStatus: { type: DataTypes.STRING(24), allowNull: false },
        actorId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        note: { type: DataTypes.STRING(500), allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'consultation_events', updatedAt: false },
    );
  }
}
