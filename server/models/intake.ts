import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { ReferralLevel } from '@shared/fit/triage';
import type { IntakeView, RidingGoal, SymptomDraft } from '@shared/rider';

export type StoredTriage = NonNullable<IntakeView['triage']>;

/**
 * "Tell us what hurts". A rider has at most one draft; submitted intakes are never edited (a
 * new answer is a new intake), and carry the triage the server computed at submission.
 */
export class Intake extends Model<InferAttributes<Intake>, InferCreationAttributes<Intake>> {
  declare id: CreationOptional<number>;
  declare riderId: number;
  declare status: 'draft' | 'submitted';
  declare symptoms: SymptomDraft[];
  declare redFlagAnswers: IntakeView['redFlagAnswers'];
  declare goals: RidingGoal[];
  declare goalNotes: string;
  declare bikeId: number | null;
  declare triageLevel: ReferralLevel | null;
  declare triage: StoredTriage | null;
  declare consentId: number | null;
  declare submittedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof Intake {
    return Intake.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        riderId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        status: { type: DataTypes.ENUM('draft', 'submitted'), allowNull: false },
        symptoms: { type: DataTypes.JSON, allowNull: false },
        redFlagAnswers: { type: DataTypes.JSON, allowNull: false },
        goals: { type: DataTypes.JSON, allowNull: false },
        goalNotes: { type: DataTypes.TEXT, allowNull: false },
        bikeId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        triageLevel: { type: DataTypes.ENUM('none', 'physio-routine', 'physio-soon', 'urgent'), allowNull: true },
        triage: { type: DataTypes.JSON, allowNull: true },
        consentId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        submittedAt: { type: DataTypes.DATE(3), allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'intakes' },
    );
  }
}
