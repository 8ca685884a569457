import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

/**
 * Business cases: immutable snapshots. `inputs` holds what was assessed (motors, sites, Settings),
 * `results` what came out; only the status and the decision change after creation.
 */
export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('business_cases', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    organization_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'organizations', key: 'id' },
      onDelete: 'CASCADE',
    },
    scope: { type: DataTypes.ENUM('site', 'all'), allowNull: false },
    // Sites are archived, not deleted; RESTRICT keeps a snapshot's site from vanishing under it.
    site_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'sites', key: 'id' }, onDelete: 'RESTRICT' },
    version: { type: DataTypes.INTEGER, allowNull: false },
    status: { type: DataTypes.ENUM('draft', 'sent', 'approved', 'rejected'), allowNull: false, defaultValue: 'draft' },
    title: { type: DataTypes.STRING(200), allowNull: false },
    currency: { type: DataTypes.CHAR(3), allowNull: false },
    headline: { type: DataTypes.JSONB, allowNull: false },
    inputs: { type: DataTypes.JSONB, allowNull: false },
    results: { type: DataTypes.JSONB, allowNull: false },
    created_by: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    decided_by: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    decided_at: { type: DataTypes.DATE, allowNull: true },
    decision_comment: { type: DataTypes.TEXT, allowNull: true },
    last_sent_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex('business_cases', ['organization_id', 'created_at']);
  await queryInterface.addIndex('business_cases', ['organization_id', 'site_id', 'version'], {
    unique: true,
    name: 'business_cases_site_version_unique',
    where: { scope: 'site' },
  });
  await queryInterface.addIndex('business_cases', ['organization_id', 'version'], {
    unique: true,
    name: 'business_cases_all_version_unique',
    where: { scope: 'all' },
  });
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('business_cases', {});
  await queryInterface.sequelize.query('DROP TYPE IF EXISTS "enum_business_cases_scope"; DROP TYPE IF EXISTS "enum_business_cases_status";');
};
