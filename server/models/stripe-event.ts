import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** Ids of Stripe webhook events already handled; a replay finds its id here and is ignored. */
export class StripeEvent extends Model<InferAttributes<StripeEvent>, InferCreationAttributes<StripeEvent>> {
  declare id: string;
  declare type: string;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof StripeEvent {
    return StripeEvent.init(
      {
        id: { type: DataTypes.STRING(80), primaryKey: true },
        type: { type: DataTypes.STRING(80), allowNull: false },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'stripe_events', updatedAt: false },
    );
  }
}
