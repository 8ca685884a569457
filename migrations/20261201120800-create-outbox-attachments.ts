import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('outbox_attachments', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    message_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'outbox_messages', key: 'id' },
      onDelete: 'CASCADE',
    },
    filename: { type: DataTypes.STRING(255), allowNull: false },
    content_type: { type: DataTypes.STRING(120), allowNull: false },
    size_bytes: { type: DataTypes.INTEGER, allowNull: false },
    content: { type: DataTypes.BLOB, allowNull: false },
  });
  await queryInterface.addIndex('outbox_attachments', ['message_id']);
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('outbox_attachments', {});
};
