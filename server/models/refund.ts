import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class Refund extends Model<InferAttributes<Refund>, InferCreationAttributes<Refund>> {
  declare id: CreationOptional<number>;
  declare paymentId: number;
  declare idempotencyKey: string;
  declare stripeRefundId: string | null;
  declare amountMinor: number;
  declare reason: string;
  declare actorId: number | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof Refund {
    return Refund.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        paymentId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        idempotencyKey: { type: DataTypes.STRING(80), allowNull: false, unique: true },
        stripeRefundId: { type: DataTypes.STRING(64), allowNull: true },
        amountMinor: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        reason: { type: DataTypes.STRING(300), allowNull: false },
        actorId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'refunds', updatedAt: false },
    );
  }
}
