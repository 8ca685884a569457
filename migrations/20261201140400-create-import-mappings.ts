import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

/** Column mappings remembered per organisation: a normalised header → the motor field it meant (null: ignored). */
export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('import_mappings', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    organization_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'organizations', key: 'id' },
      onDelete: 'CASCADE',
    },
    header_key: { type: DataTypes.STRING(200), allowNull: false },
    field: { type: DataTypes.STRING(40), allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex('import_mappings', ['organization_id', 'header_key'], { unique: true, name: 'import_mappings_org_header_unique' });
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('import_mappings', {});
};
