import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Role } from '../shared/roles.js';

export type UserStatus = 'active' | 'invited' | 'disabled';

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare email: string;
  declare name: string;
  declare role: Role;
  declare status: CreationOptional<UserStatus>;
  declare passwordHash: string | null;
  declare invitationTokenHash: CreationOptional<string | null>;
  declare invitationExpiresAt: CreationOptional<Date | null>;
  declare failedSignIns: CreationOptional<number>;
  declare lockedUntil: CreationOptional<Date | null>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    User.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false },
        email: { type: DataTypes.STRING(200), allowNull: false, unique: true },
        name: { type: DataTypes.STRING(120), allowNull: false },
        role: { type: DataTypes.ENUM('admin', 'engineer', 'approver', 'viewer'), allowNull: false },
        status: { type: DataTypes.ENUM('active', 'invited', 'disabled'), allowNull: false, defaultValue: 'active' },
        passwordHash: { type: DataTypes.STRING(300), allowNull: true },
        invitationTokenHash: { type: DataTypes.STRING(128), allowNull: true },
        invitationExpiresAt: { type: DataTypes.DATE, allowNull: true },
        failedSignIns: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        lockedUntil: { type: DataTypes.DATE, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'users', underscored: true },
    );
  }
}
