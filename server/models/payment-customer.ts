import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** The Stripe customer made for a rider, reused for later bookings. */
export class PaymentCustomer extends Model<InferAttributes<PaymentCustomer>, InferCreationAttributes<PaymentCustomer>> {
  declare userId: number;
  declare stripeCustomerId: string;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof PaymentCustomer {
    return PaymentCustomer.init(
      {
        userId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
        stripeCustomerId: { type: DataTypes.STRING(64), allowNull: false },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'payment_customers', updatedAt: false },
    );
  }
}
