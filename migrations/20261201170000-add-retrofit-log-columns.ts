import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

/**
 * The Retrofit log's own fields on a retrofit: dates of the order and the installation (and the
 * installation date the order promised, which flags an overdue order), actual capex and rebate
 * received (NUMERIC money), the installed motor's and drive's data, notes, and when the status last
 * changed (which flags a proposal waiting too long for a decision).
 */
const COLUMNS = {
  order_date: { type: DataTypes.DATEONLY, allowNull: true },
  expected_installation_date: { type: DataTypes.DATEONLY, allowNull: true },
  installation_date: { type: DataTypes.DATEONLY, allowNull: true },
  actual_capex: { type: DataTypes.DECIMAL(16, 2), allowNull: true },
  rebate_received: { type: DataTypes.DECIMAL(16, 2), allowNull: true },
  installed_equipment: { type: DataTypes.JSONB, allowNull: true },
  notes: { type: DataTypes.TEXT, allowNull: true },
  status_changed_at: { type: DataTypes.DATE, allowNull: true },
} as const;

export const up: Migration = async ({ context: queryInterface }) => {
  for (const [name, definition] of Object.entries(COLUMNS)) await queryInterface.addColumn('retrofits', name, definition);
};

export const down: Migration = async ({ context: queryInterface }) => {
  for (const name of Object.keys(COLUMNS).reverse()) await queryInterface.removeColumn('retrofits', name);
};
