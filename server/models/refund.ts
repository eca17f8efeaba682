import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const REFUND_STATUSES = ['pending', 'succeeded', 'failed'] as const;
export type RefundStatus = (typeof REFUND_STATUSES)[number];
/** Which e-mail goes to the rider once the refund succeeds (exactly once, see noticeSentAt). */
export const REFUND_NOTICES = ['none', 'cancellation', 'refund'] as const;
export type RefundNotice = (typeof REFUND_NOTICES)[number];

/**
 * A refund, recorded as `pending` with its cause and settled by the refund job when Stripe answers.
 * The idempotency key names the cause (`cancel-12`, `admin-<uuid>`), so a cause refunds at most once.
 */
export class Refund extends Model<InferAttributes<Refund>, InferCreationAttributes<Refund>> {
  declare id: CreationOptional<number>;
  declare paymentId: number;
  declare idempotencyKey: string;
  declare stripeRefundId: string | null;
  declare amountMinor: number;
  declare reason: string;
  declare actorId: number | null;
  declare status: CreationOptional<RefundStatus>;
  declare notice: CreationOptional<RefundNotice>;
  declare lastError: CreationOptional<string | null>;
  declare settledAt: CreationOptional<Date | null>;
  declare noticeSentAt: CreationOptional<Date | null>;
  /** How many times Stripe was asked for this refund. */
  declare attempts: CreationOptional<number>;
  /** How many times an admin pressed Try again; after one, Stripe is asked what it made before sending again. */
  declare adminRetries: CreationOptional<number>;
  /** The last Try again's attempt id (a client UUID): the same id again re-queues nothing. */
  declare retryKey: CreationOptional<string | null>;
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
        status: { type: DataTypes.ENUM(...REFUND_STATUSES), allowNull: false, defaultValue: 'succeeded' },
        notice: { type: DataTypes.ENUM(...REFUND_NOTICES), allowNull: false, defaultValue: 'none' },
        lastError: { type: DataTypes.STRING(300), allowNull: true },
        settledAt: { type: DataTypes.DATE, allowNull: true },
        noticeSentAt: { type: DataTypes.DATE, allowNull: true },
        attempts: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
        adminRetries: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
        retryKey: { type: DataTypes.STRING(36), allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'refunds', updatedAt: false },
    );
  }
}
