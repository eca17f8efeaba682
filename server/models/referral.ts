import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { REFERRAL_STATUSES, REFERRAL_URGENCIES, type PhysioDecision, type ReferralStatus, type ReferralUrgency } from '@shared/care';
import type { PhysioLimits } from '@shared/fit/planner';

/** A case handed to a physiotherapist; status changes only through services/referrals.ts. */
export class Referral extends Model<InferAttributes<Referral>, InferCreationAttributes<Referral>> {
  declare id: CreationOptional<number>;
  declare consultationId: number;
  declare riderId: number;
  declare fitterId: number;
  declare physioId: number | null;
  declare origin: 'fitter' | 'system' | 'red-flag';
  declare urgency: ReferralUrgency;
  declare status: ReferralStatus;
  declare reason: string;
  declare findings: string;
  declare attachmentIds: number[];
  /** The rider's share-with-physio consent for this referral. */
  declare consentId: number | null;
  declare decision: PhysioDecision | null;
  declare responseNote: string | null;
  declare limits: Partial<PhysioLimits> | null;
  declare holdReason: string | null;
  declare declineNote: string | null;
  declare sentAt: Date | null;
  declare receivedAt: Date | null;
  declare acceptedAt: Date | null;
  declare closedAt: Date | null;
  declare escalatedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof Referral {
    return Referral.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        consultationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        riderId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        fitterId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        physioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        origin: { type: DataTypes.ENUM('fitter', 'system', 'red-flag'), allowNull: false },
        urgency: { type: DataTypes.ENUM(...REFERRAL_URGENCIES), allowNull: false },
        status: { type: DataTypes.ENUM(...REFERRAL_STATUSES), allowNull: false },
        reason: { type: DataTypes.TEXT, allowNull: false },
        findings: { type: DataTypes.TEXT, allowNull: false },
        attachmentIds: { type: DataTypes.JSON, allowNull: false },
        consentId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        decision: { type: DataTypes.STRING(24), allowNull: true },
        responseNote: { type: DataTypes.TEXT, allowNull: true },
        limits: { type: DataTypes.JSON, allowNull: true },
        holdReason: { type: DataTypes.STRING(500), allowNull: true },
        declineNote: { type: DataTypes.STRING(1000), allowNull: true },
        sentAt: { type: DataTypes.DATE, allowNull: true },
        receivedAt: { type: DataTypes.DATE, allowNull: true },
        acceptedAt: { type: DataTypes.DATE, allowNull: true },
        closedAt: { type: DataTypes.DATE, allowNull: true },
        escalatedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'referrals' },
    );
  }
}
