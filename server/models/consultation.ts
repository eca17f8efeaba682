import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { CONSULTATION_STATES, type ConsultationState } from '@shared/consultation';

/**
 * A booked (or being-booked) consultation between a rider and a fitter, and later the case the
 * plan, chat and referrals hang off. `status` changes only through services/consultation-states.ts.
 */
export class Consultation extends Model<InferAttributes<Consultation>, InferCreationAttributes<Consultation>> {
  declare id: CreationOptional<number>;
  declare riderId: number;
  declare fitterId: number;
  declare intakeId: number | null;
  declare status: ConsultationState;
  declare startsAt: Date;
  declare endsAt: Date;
  /** When a held slot is released if payment has not completed. */
  declare holdExpiresAt: Date | null;
  declare feeMinor: number;
  declare currency: string;
  /** Stable calendar UID; the sequence goes up on every reschedule or cancel. */
  declare calendarUid: string;
  declare calendarSequence: CreationOptional<number>;
  /** The intake's triage asked for a physio's eye. */
  declare flaggedForPhysio: CreationOptional<boolean>;
  /** The chat's last sequence number; incremented under a row lock so order holds with many senders. */
  declare lastMessageSeq: CreationOptional<number>;
  declare cancelledById: number | null;
  declare cancelReason: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof Consultation {
    return Consultation.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        riderId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        fitterId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        intakeId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        status: { type: DataTypes.ENUM(...CONSULTATION_STATES), allowNull: false },
        startsAt: { type: DataTypes.DATE, allowNull: false },
        endsAt: { type: DataTypes.DATE, allowNull: false },
        holdExpiresAt: { type: DataTypes.DATE, allowNull: true },
        feeMinor: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        currency: { type: DataTypes.CHAR(3), allowNull: false },
        calendarUid: { type: DataTypes.STRING(80), allowNull: false },
        calendarSequence: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
        flaggedForPhysio: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        lastMessageSeq: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
        cancelledById: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        cancelReason: { type: DataTypes.STRING(500), allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'consultations' },
    );
  }
}
