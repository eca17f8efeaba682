import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const STEP_STATES = ['locked', 'current', 'applied'] as const;
export type StepState = (typeof STEP_STATES)[number];

/** Progress through one step of a plan; what the step changes lives in the plan's JSON. */
export class PlanStep extends Model<InferAttributes<PlanStep>, InferCreationAttributes<PlanStep>> {
  declare id: CreationOptional<number>;
  declare planId: number;
  declare stepIndex: number;
  declare state: StepState;
  /** Moves later when the step before was applied late (the adaptation clock starts at application). */
  declare earliestDate: string;
  declare minRides: number;
  declare appliedOn: string | null;
  declare checkInDue: string | null;
  declare checkedInAt: Date | null;
  declare overdueAt: Date | null;
  declare snapshotId: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof PlanStep {
    return PlanStep.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        planId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        stepIndex: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        state: { type: DataTypes.ENUM(...STEP_STATES), allowNull: false },
        earliestDate: { type: DataTypes.DATEONLY, allowNull: false },
        minRides: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        appliedOn: { type: DataTypes.DATEONLY, allowNull: true },
        checkInDue: { type: DataTypes.DATEONLY, allowNull: true },
        checkedInAt: { type: DataTypes.DATE, allowNull: true },
        overdueAt: { type: DataTypes.DATE, allowNull: true },
        snapshotId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'plan_steps' },
    );
  }
}
