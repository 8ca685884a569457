import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('bldc_designs', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    organization_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'organizations', key: 'id' },
      onDelete: 'CASCADE',
    },
    // The motor the design was sized for; linking a motor to a design is motors.bldc_design_id.
    motor_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'motors', key: 'id' }, onDelete: 'SET NULL' },
    name: { type: DataTypes.STRING(120), allowNull: false },
    input: { type: DataTypes.JSONB, allowNull: false },
    applied_defaults: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    result: { type: DataTypes.JSONB, allowNull: false },
    rated_power_kw: { type: DataTypes.DOUBLE, allowNull: false },
    speed_rpm: { type: DataTypes.DOUBLE, allowNull: false },
    feasible: { type: DataTypes.BOOLEAN, allowNull: false },
    created_by: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex('bldc_designs', ['organization_id', 'created_at']);
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('bldc_designs', {});
};
