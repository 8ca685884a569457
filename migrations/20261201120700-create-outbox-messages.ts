import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('outbox_messages', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    // Taken from the message's X-Statorline-Organization header; null for mail of no organisation.
    organization_id: {
      type: DataTypes.INTEGER,
      allowNull: true,
      references: { model: 'organizations', key: 'id' },
      onDelete: 'CASCADE',
    },
    message_id: { type: DataTypes.STRING(300), allowNull: true },
    from_address: { type: DataTypes.STRING(300), allowNull: false },
    to_addresses: { type: DataTypes.JSONB, allowNull: false },
    subject: { type: DataTypes.STRING(500), allowNull: false },
    text_body: { type: DataTypes.TEXT, allowNull: false },
    html_body: { type: DataTypes.TEXT, allowNull: true },
    headers: { type: DataTypes.JSONB, allowNull: false },
    received_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex('outbox_messages', ['organization_id', 'received_at']);
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('outbox_messages', {});
};
