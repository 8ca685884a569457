import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

/**
 * How a retrofit's savings are verified: IPMVP option 'A' or 'B', the independent variable (a
 * column of the meter files; null: operating hours counted from the metered power), the stipulated
 * operating hours for option A (null: the motor register's hoursPerYear), and the verified figures
 * frozen when the retrofit is marked verified (the Overview reads them).
 */
const COLUMNS = {
  verification_method: { type: DataTypes.STRING(1), allowNull: false, defaultValue: 'B' },
  independent_variable: { type: DataTypes.STRING(80), allowNull: true },
  stipulated_hours_per_year: { type: DataTypes.DOUBLE, allowNull: true },
  verified_savings_kwh: { type: DataTypes.DOUBLE, allowNull: true },
  verified_uncertainty_kwh: { type: DataTypes.DOUBLE, allowNull: true },
} as const;

export const up: Migration = async ({ context: queryInterface }) => {
  for (const [name, definition] of Object.entries(COLUMNS)) await queryInterface.addColumn('retrofits', name, definition);
};

export const down: Migration = async ({ context: queryInterface }) => {
  for (const name of Object.keys(COLUMNS).reverse()) await queryInterface.removeColumn('retrofits', name);
};
