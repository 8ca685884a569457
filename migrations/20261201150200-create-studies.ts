import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('studies', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    organization_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'organizations', key: 'id' },
      onDelete: 'CASCADE',
    },
    motor_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'motors', key: 'id' }, onDelete: 'SET NULL' },
    name: { type: DataTypes.STRING(120), allowNull: false },
    // The assess input as computed (after the organisation's settings were filled in) and calc's result.
    input: { type: DataTypes.JSONB, allowNull: false },
    result: { type: DataTypes.JSONB, allowNull: false },
    recommended_code: { type: DataTypes.STRING(20), allowNull: false },
    savings_kwh: { type: DataTypes.DOUBLE, allowNull: false },
    savings_cost: { type: DataTypes.DECIMAL(16, 2), allowNull: false },
    npv: { type: DataTypes.DECIMAL(16, 2), allowNull: false },
    created_by: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex('studies', ['organization_id', 'created_at']);
  await queryInterface.addIndex('studies', ['motor_id']);
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('studies', {});
};
