import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('materials', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    organization_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'organizations', key: 'id' },
      onDelete: 'CASCADE',
    },
    kind: { type: DataTypes.ENUM('magnet', 'steel'), allowNull: false },
    name: { type: DataTypes.STRING(60), allowNull: false },
    // calc/bldc's MagnetGrade or LaminationSteel fields, without the name.
    properties: { type: DataTypes.JSONB, allowNull: false },
    created_by: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex('materials', ['organization_id', 'kind', 'name'], { unique: true, name: 'materials_organization_kind_name_unique' });
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('materials', {});
  await queryInterface.sequelize.query('DROP TYPE IF EXISTS "enum_materials_kind";');
};
