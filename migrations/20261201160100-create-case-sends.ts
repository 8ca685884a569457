import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

/** Each e-mailing of a business case: who sent it, to whom, when, the SMTP message id. */
export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('case_sends', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    organization_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'organizations', key: 'id' },
      onDelete: 'CASCADE',
    },
    case_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'business_cases', key: 'id' }, onDelete: 'CASCADE' },
    sent_by: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    to_addresses: { type: DataTypes.JSONB, allowNull: false },
    message_id: { type: DataTypes.STRING(300), allowNull: true },
    sent_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex('case_sends', ['case_id', 'sent_at']);
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('case_sends', {});
};
