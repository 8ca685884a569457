import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('users', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    organization_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'organizations', key: 'id' },
      onDelete: 'CASCADE',
    },
    email: { type: DataTypes.STRING(200), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    role: { type: DataTypes.ENUM('admin', 'engineer', 'approver', 'viewer'), allowNull: false },
    status: { type: DataTypes.ENUM('active', 'invited', 'disabled'), allowNull: false, defaultValue: 'active' },
    password_hash: { type: DataTypes.STRING(300), allowNull: true },
    invitation_token_hash: { type: DataTypes.STRING(128), allowNull: true, unique: true },
    invitation_expires_at: { type: DataTypes.DATE, allowNull: true },
    failed_sign_ins: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    locked_until: { type: DataTypes.DATE, allowNull: true },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex('users', ['organization_id']);
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('users', {});
  await queryInterface.sequelize.query('DROP TYPE IF EXISTS "enum_users_role"; DROP TYPE IF EXISTS "enum_users_status";');
};
