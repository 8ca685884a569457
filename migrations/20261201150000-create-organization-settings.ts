import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('organization_settings', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    organization_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      unique: true,
      references: { model: 'organizations', key: 'id' },
      onDelete: 'CASCADE',
    },
    // What the admin stored, as calc's priceBookSchema / assumptionsSchema take it; null = calc's defaults.
    price_book: { type: DataTypes.JSONB, allowNull: true },
    price_book_version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    assumptions: { type: DataTypes.JSONB, allowNull: true },
    assumptions_version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('organization_settings', {});
};
