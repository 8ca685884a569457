import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('motor_measurements', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    organization_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'organizations', key: 'id' },
      onDelete: 'CASCADE',
    },
    motor_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'motors', key: 'id' }, onDelete: 'CASCADE' },
    measured_at: { type: DataTypes.DATE, allowNull: false },
    input_power_kw: { type: DataTypes.DOUBLE, allowNull: true },
    speed_rpm: { type: DataTypes.DOUBLE, allowNull: true },
    current_a: { type: DataTypes.DOUBLE, allowNull: true },
    voltage_v: { type: DataTypes.DOUBLE, allowNull: true },
    note: { type: DataTypes.STRING(500), allowNull: true },
    user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex('motor_measurements', ['motor_id', 'measured_at']);
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('motor_measurements', {});
};
