import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { ACCOUNT_STATUSES, ROLES, type AccountStatus, type Role } from '@shared/auth';

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>;
  declare email: string;
  declare passwordHash: string;
  declare role: Role;
  declare displayName: string;
  declare timeZone: string;
  declare status: AccountStatus;
  declare approvedAt: CreationOptional<Date | null>;
  declare approvedById: CreationOptional<number | null>;
  declare lastSignInAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof User {
    return User.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
        passwordHash: { type: DataTypes.STRING(100), allowNull: false },
        role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
        displayName: { type: DataTypes.STRING(80), allowNull: false },
        timeZone: { type: DataTypes.STRING(64), allowNull: false },
        status: { type: DataTypes.ENUM(...ACCOUNT_STATUSES), allowNull: false },
        approvedAt: { type: DataTypes.DATE, allowNull: true },
        approvedById: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        lastSignInAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'users' },
    );
  }
}
