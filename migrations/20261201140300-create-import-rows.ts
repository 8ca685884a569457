import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

/** The staging rows of an import batch: raw cells, parsed values, issues, and what the commit did. */
export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('import_rows', {
    id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
    batch_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'import_batches', key: 'id' }, onDelete: 'CASCADE' },
    row_number: { type: DataTypes.INTEGER, allowNull: false },
    cells: { type: DataTypes.JSONB, allowNull: false },
    values: { type: DataTypes.JSONB, allowNull: false },
    errors: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    warnings: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    valid: { type: DataTypes.BOOLEAN, allowNull: false },
    action: { type: DataTypes.STRING(10), allowNull: false },
    // No foreign key: the motor may be removed later and the batch keeps its record.
    motor_id: { type: DataTypes.INTEGER, allowNull: true },
    // The motor's values before the commit updated it, for undo.
    previous: { type: DataTypes.JSONB, allowNull: true },
  });
  await queryInterface.addIndex('import_rows', ['batch_id', 'row_number'], { unique: true });
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('import_rows', {});
};
