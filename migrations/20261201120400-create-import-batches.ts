import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('import_batches', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    organization_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'organizations', key: 'id' },
      onDelete: 'CASCADE',
    },
    site_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'sites', key: 'id' }, onDelete: 'CASCADE' },
    user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    file_name: { type: DataTypes.STRING(255), allowNull: false },
    status: {
      type: DataTypes.ENUM('parsing', 'previewed', 'committing', 'committed', 'failed', 'undone'),
      allowNull: false,
      defaultValue: 'parsing',
    },
    mapping: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    total_rows: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    valid_rows: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    invalid_rows: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    created_count: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    updated_count: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    committed_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex('import_batches', ['organization_id', 'created_at']);
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('import_batches', {});
  await queryInterface.sequelize.query('DROP TYPE IF EXISTS "enum_import_batches_status";');
};
