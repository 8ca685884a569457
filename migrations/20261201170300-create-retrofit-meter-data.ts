import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

/**
 * Metered data of a retrofit, one row per period (baseline, reporting): the accepted upload as a
 * compact series (JSONB of [start ms, duration h, kWh, variable]) with its unit, register kind,
 * meter scope, typical interval and the gaps found. A new upload of a period replaces the row.
 */
export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('retrofit_meter_data', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    organization_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'organizations', key: 'id' }, onDelete: 'CASCADE' },
    retrofit_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'retrofits', key: 'id' }, onDelete: 'CASCADE' },
    period: { type: DataTypes.STRING(10), allowNull: false },
    unit: { type: DataTypes.STRING(4), allowNull: false },
    register: { type: DataTypes.STRING(12), allowNull: false },
    scope: { type: DataTypes.STRING(8), allowNull: false },
    file_name: { type: DataTypes.STRING(255), allowNull: false },
    variable_name: { type: DataTypes.STRING(80), allowNull: true },
    // The file's UTC offset ('+01:00'), or null when its timestamps carried none; points hold wall-clock time.
    utc_offset: { type: DataTypes.STRING(6), allowNull: true },
    interval_minutes: { type: DataTypes.DOUBLE, allowNull: false },
    rows: { type: DataTypes.INTEGER, allowNull: false },
    points: { type: DataTypes.JSONB, allowNull: false },
    gaps: { type: DataTypes.JSONB, allowNull: false },
    user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex('retrofit_meter_data', ['retrofit_id', 'period'], { unique: true, name: 'retrofit_meter_data_period_unique' });
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('retrofit_meter_data', {});
};
