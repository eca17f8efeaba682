import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const PAYMENT_STATUSES = ['pending', 'succeeded', 'failed', 'refunded', 'partially_refunded'] as const;
export type PaymentStatus = (typeof PAYMENT_STATUSES)[number];

/** One payment attempt; `attemptKey` is the client's idempotency key, unique per attempt. */
export class Payment extends Model<InferAttributes<Payment>, InferCreationAttributes<Payment>> {
  declare id: CreationOptional<number>;
  declare consultationId: number;
  declare riderId: number | null;
  declare attemptKey: string;
  declare stripeCustomerId: string | null;
  declare stripeChargeId: string | null;
  declare amountMinor: number;
  declare currency: string;
  declare status: PaymentStatus;
  declare refundedMinor: CreationOptional<number>;
  declare failureMessage: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof Payment {
    return Payment.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        consultationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        riderId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        attemptKey: { type: DataTypes.STRING(80), allowNull: false, unique: true },
        stripeCustomerId: { type: DataTypes.STRING(64), allowNull: true },
        stripeChargeId: { type: DataTypes.STRING(64), allowNull: true },
        amountMinor: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        currency: { type: DataTypes.CHAR(3), allowNull: false },
        status: { type: DataTypes.ENUM(...PAYMENT_STATUSES), allowNull: false },
        refundedMinor: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
        failureMessage: { type: DataTypes.STRING(300), allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'payments' },
    );
  }
}
