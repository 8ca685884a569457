import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

/** Documents (PDF) and photos of a retrofit; the bytes live under UPLOAD_DIR as `storage_key`. */
export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('retrofit_files', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    organization_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'organizations', key: 'id' }, onDelete: 'CASCADE' },
    retrofit_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'retrofits', key: 'id' }, onDelete: 'CASCADE' },
    kind: { type: DataTypes.STRING(20), allowNull: false },
    file_name: { type: DataTypes.STRING(255), allowNull: false },
    content_type: { type: DataTypes.STRING(60), allowNull: false },
    size_bytes: { type: DataTypes.INTEGER, allowNull: false },
    // Random name of the stored file under UPLOAD_DIR; never derived from the user's file name.
    storage_key: { type: DataTypes.STRING(100), allowNull: false },
    sha256: { type: DataTypes.STRING(64), allowNull: false },
    user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex('retrofit_files', ['retrofit_id']);
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('retrofit_files', {});
};
