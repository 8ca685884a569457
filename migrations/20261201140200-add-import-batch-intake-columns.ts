import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

/** What the Intake keeps about a batch besides its counts: the parsed layout, the stored file, progress. */
const COLUMNS = {
  headers: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
  header_row: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
  sheet_name: { type: DataTypes.STRING(100), allowNull: false, defaultValue: '' },
  file_key: { type: DataTypes.STRING(100), allowNull: true },
  file_size_bytes: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
  warning_rows: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
  duplicates: { type: DataTypes.JSONB, allowNull: false, defaultValue: { inFile: [], inRegister: [] } },
  progress: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
  failure: { type: DataTypes.TEXT, allowNull: true },
  undone_at: { type: DataTypes.DATE, allowNull: true },
} as const;

export const up: Migration = async ({ context: queryInterface }) => {
  for (const [name, definition] of Object.entries(COLUMNS)) await queryInterface.addColumn('import_batches', name, definition);
};

export const down: Migration = async ({ context: queryInterface }) => {
  for (const name of Object.keys(COLUMNS).reverse()) await queryInterface.removeColumn('import_batches', name);
};
