import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('sites', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    organization_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'organizations', key: 'id' },
      onDelete: 'CASCADE',
    },
    name: { type: DataTypes.STRING(120), allowNull: false },
    code: { type: DataTypes.STRING(20), allowNull: true },
    location: { type: DataTypes.STRING(200), allowNull: true },
    voltage_v: { type: DataTypes.DOUBLE, allowNull: false },
    frequency_hz: { type: DataTypes.INTEGER, allowNull: false },
    // Money as NUMERIC: prices per kWh need more places than a currency's cents.
    energy_price_per_kwh: { type: DataTypes.DECIMAL(14, 6), allowNull: false },
    time_of_use: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    demand_charge_per_kw_month: { type: DataTypes.DECIMAL(14, 4), allowNull: false, defaultValue: 0 },
    currency: { type: DataTypes.CHAR(3), allowNull: false },
    co2_kg_per_kwh: { type: DataTypes.DOUBLE, allowNull: false },
    default_hours_per_year: { type: DataTypes.INTEGER, allowNull: false },
    archived_at: { type: DataTypes.DATE, allowNull: true },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex('sites', ['organization_id', 'name']);
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('sites', {});
};
