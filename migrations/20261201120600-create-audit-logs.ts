import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('audit_logs', {
    id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
    organization_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'organizations', key: 'id' },
      onDelete: 'CASCADE',
    },
    user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    action: { type: DataTypes.STRING(40), allowNull: false },
    entity: { type: DataTypes.STRING(40), allowNull: false },
    entity_id: { type: DataTypes.INTEGER, allowNull: true },
    changes: { type: DataTypes.JSONB, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex('audit_logs', ['organization_id', 'entity', 'entity_id']);
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('audit_logs', {});
};
