import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

/** The transition history of a retrofit: from which status to which, who, when, and their comment. */
export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('retrofit_events', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    organization_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'organizations', key: 'id' }, onDelete: 'CASCADE' },
    retrofit_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'retrofits', key: 'id' }, onDelete: 'CASCADE' },
    // Null for the creation event.
    from_status: { type: DataTypes.STRING(20), allowNull: true },
    to_status: { type: DataTypes.STRING(20), allowNull: false },
    user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    comment: { type: DataTypes.TEXT, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex('retrofit_events', ['retrofit_id', 'created_at']);
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('retrofit_events', {});
};
