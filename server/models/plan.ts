import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Plan as PlanBody, PlanInput } from '@shared/fit/planner';

export const STORED_PLAN_STATUSES = ['active', 'on_hold', 'superseded', 'completed'] as const;
export type StoredPlanStatus = (typeof STORED_PLAN_STATUSES)[number];

/** A plan as sent to the rider: the shared planner's output plus the server-built inputs it was checked against. */
export class Plan extends Model<InferAttributes<Plan>, InferCreationAttributes<Plan>> {
  declare id: CreationOptional<number>;
  declare consultationId: number;
  declare riderId: number;
  declare fitterId: number;
  declare bikeId: number;
  declare kind: 'forward' | 'revert';
  declare status: StoredPlanStatus;
  declare plan: PlanBody;
  declare inputs: PlanInput;
  declare holdReason: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof Plan {
    return Plan.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        consultationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        riderId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        fitterId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        bikeId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        kind: { type: DataTypes.ENUM('forward', 'revert'), allowNull: false },
        status: { type: DataTypes.ENUM(...STORED_PLAN_STATUSES), allowNull: false },
        plan: { type: DataTypes.JSON, allowNull: false },
        inputs: { type: DataTypes.JSON, allowNull: false },
        holdReason: { type: DataTypes.STRING(500), allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'plans' },
    );
  }
}
