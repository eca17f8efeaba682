import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** Rows kept by connect-session-sequelize; one per signed-in browser. */
export class Session extends Model<InferAttributes<Session>, InferCreationAttributes<Session>> {
  declare sid: string;
  declare expires: Date | null;
  declare data: string | null;
  declare userId: number | null;

  static initModel(sequelize: Sequelize): typeof Session {
    return Session.init(
      {
        sid: { type: DataTypes.STRING(64), primaryKey: true },
        expires: { type: DataTypes.DATE, allowNull: true },
        data: { type: DataTypes.TEXT('medium'), allowNull: true },
        userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      },
      { sequelize, tableName: 'sessions', timestamps: true },
    );
  }
}
