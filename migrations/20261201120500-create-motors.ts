import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

export const up: Migration = async ({ context: queryInterface }) => {
  await queryInterface.createTable('motors', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    organization_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'organizations', key: 'id' },
      onDelete: 'CASCADE',
    },
    site_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'sites', key: 'id' }, onDelete: 'CASCADE' },
    tag: { type: DataTypes.STRING(60), allowNull: false },
    description: { type: DataTypes.STRING(200), allowNull: true },
    area: { type: DataTypes.STRING(80), allowNull: true },
    application: {
      type: DataTypes.ENUM('fan', 'pump', 'compressor', 'conveyor', 'mixer', 'other'),
      allowNull: false,
      defaultValue: 'other',
    },
    rated_power_kw: { type: DataTypes.DOUBLE, allowNull: false },
    speed_rpm: { type: DataTypes.DOUBLE, allowNull: true },
    poles: { type: DataTypes.INTEGER, allowNull: false },
    voltage_v: { type: DataTypes.DOUBLE, allowNull: false },
    frequency_hz: { type: DataTypes.INTEGER, allowNull: false },
    rated_current_a: { type: DataTypes.DOUBLE, allowNull: true },
    efficiency_class: {
      type: DataTypes.ENUM('IE1', 'IE2', 'IE3', 'IE4', 'IE5', 'unknown'),
      allowNull: false,
      defaultValue: 'unknown',
    },
    nameplate_efficiency_pct: { type: DataTypes.DOUBLE, allowNull: true },
    power_factor: { type: DataTypes.DOUBLE, allowNull: true },
    frame: { type: DataTypes.STRING(20), allowNull: true },
    enclosure: { type: DataTypes.STRING(20), allowNull: true },
    manufacturer: { type: DataTypes.STRING(80), allowNull: true },
    year_installed: { type: DataTypes.INTEGER, allowNull: true },
    rewinds: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    control_method: {
      type: DataTypes.ENUM('direct-on-line', 'throttle-valve', 'outlet-damper', 'inlet-vanes', 'variable-speed-drive'),
      allowNull: false,
      defaultValue: 'direct-on-line',
    },
    hours_per_year: { type: DataTypes.DOUBLE, allowNull: true },
    load_factor: { type: DataTypes.DOUBLE, allowNull: true },
    duty_profile: { type: DataTypes.JSONB, allowNull: true },
    status: {
      type: DataTypes.ENUM('in-service', 'standby', 'out-of-service', 'retired'),
      allowNull: false,
      defaultValue: 'in-service',
    },
    notes: { type: DataTypes.TEXT, allowNull: true },
    import_batch_id: {
      type: DataTypes.INTEGER,
      allowNull: true,
      references: { model: 'import_batches', key: 'id' },
      onDelete: 'SET NULL',
    },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex('motors', ['site_id', 'tag'], { unique: true, name: 'motors_site_tag_unique' });
  await queryInterface.addIndex('motors', ['organization_id', 'tag']);
  await queryInterface.addIndex('motors', ['organization_id', 'rated_power_kw']);
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.dropTable('motors', {});
  await queryInterface.sequelize.query(`
    DROP TYPE IF EXISTS "enum_motors_application"; DROP TYPE IF EXISTS "enum_motors_efficiency_class";
    DROP TYPE IF EXISTS "enum_motors_control_method"; DROP TYPE IF EXISTS "enum_motors_status";`);
};
