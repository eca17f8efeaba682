import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { CheckInAnalysis, CheckInDecision } from '@shared/fit/checkin';
import type { CheckInForm } from '@shared/care';

/** A rider's report after rides on a plan step, with the shared analysis of it. */
export class CheckIn extends Model<InferAttributes<CheckIn>, InferCreationAttributes<CheckIn>> {
  declare id: CreationOptional<number>;
  declare planId: number;
  declare stepIndex: number;
  declare riderId: number;
  declare rides: number;
  declare minutesRidden: number;
  declare comfort: number;
  declare pains: CheckInForm['pains'];
  declare numbness: boolean;
  declare note: string;
  declare redFlagAnswers: CheckInForm['redFlagAnswers'];
  declare analysis: CheckInAnalysis;
  declare decision: CheckInDecision;
  /** Set when the fitter has looked at a check-in that asked for review. */
  declare reviewedAt: Date | null;
  declare reviewedBy: number | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof CheckIn {
    return CheckIn.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        planId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        stepIndex: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        riderId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        rides: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        minutesRidden: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        comfort: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false },
        pains: { type: DataTypes.JSON, allowNull: false },
        numbness: { type: DataTypes.BOOLEAN, allowNull: false },
        note: { type: DataTypes.TEXT, allowNull: false },
        redFlagAnswers: { type: DataTypes.JSON, allowNull: false },
        analysis: { type: DataTypes.JSON, allowNull: false },
        decision: { type: DataTypes.STRING(24), allowNull: false },
        reviewedAt: { type: DataTypes.DATE, allowNull: true },
        reviewedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        createdAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'check_ins', updatedAt: false },
    );
  }
}
