import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

export const up: Migration = async ({ context: queryInterface }) => {
  // Minimal for now: proposals made from a screening; the Retrofit log adds its own columns later.
  await queryInterface.createTable('retrofits', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    organization_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'organizations', key: 'id' },
      onDelete: 'CASCADE',
    },
    motor_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'motors', key: 'id' }, onDelete: 'CASCADE' },
    option_code: { type: DataTypes.STRING(20), allowNull: false },
    status: {
      type: DataTypes.ENUM('proposed', 'approved', 'rejected', 'ordered', 'installed', 'verified'),
      allowNull: false,
      defaultValue: 'proposed',
    },
    source: { type: DataTypes.ENUM('screening', 'study', 'manual'), allowNull: false },
    job_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'jobs', key: 'id' }, onDelete: 'SET NULL' },
    predicted_savings_kwh: { type: DataTypes.DOUBLE, allowNull: false },
    predicted_savings_cost: { type: DataTypes.DECIMAL(16, 2), allowNull: false },
    capex: { type: DataTypes.DECIMAL(16, 2), allowNull: false },
    npv: { type: DataTypes.DECIMAL(16, 2), allowNull: false },
    currency: { type: DataTypes.CHAR(3), allowNull: false },
    created_by: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex('retrofits', ['organization_id', 'status']);
  await queryInterface.addIndex('retrofits', ['motor_id']);
  await queryInterface.addIndex('retrofits', ['job_id', 'motor_id'], { unique: true, name: 'retrofits_job_motor_unique' });
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('retrofits', {});
  await queryInterface.sequelize.query('DROP TYPE IF EXISTS "enum_retrofits_status"; DROP TYPE IF EXISTS "enum_retrofits_source";');
};
