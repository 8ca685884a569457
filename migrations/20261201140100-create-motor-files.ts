import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('motor_files', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    organization_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'organizations', key: 'id' },
      onDelete: 'CASCADE',
    },
    motor_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'motors', key: 'id' }, onDelete: 'CASCADE' },
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
  await queryInterface.addIndex('motor_files', ['motor_id']);
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('motor_files', {});
};
