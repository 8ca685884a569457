import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const APPLICATIONS = ['fan', 'pump', 'compressor', 'conveyor', 'mixer', 'other'] as const;
export const CONTROL_METHODS = ['direct-on-line', 'throttle-valve', 'outlet-damper', 'inlet-vanes', 'variable-speed-drive'] as const;
export const EFFICIENCY_CLASSES = ['IE1', 'IE2', 'IE3', 'IE4', 'IE5', 'unknown'] as const;
export const MOTOR_STATUSES = ['in-service', 'standby', 'out-of-service', 'retired'] as const;

export interface DutyBin {
  /** Fraction of rated load, or of rated flow for a fan or pump [-]. */
  fraction: number;
  hours: number;
}

export class Motor extends Model<InferAttributes<Motor>, InferCreationAttributes<Motor>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare siteId: number;
  declare tag: string;
  declare description: string | null;
  declare area: string | null;
  declare application: (typeof APPLICATIONS)[number];
  declare ratedPowerKw: number;
  declare speedRpm: number | null;
  declare poles: number;
  declare voltageV: number;
  declare frequencyHz: number;
  declare ratedCurrentA: number | null;
  declare efficiencyClass: (typeof EFFICIENCY_CLASSES)[number];
  declare nameplateEfficiencyPct: number | null;
  declare powerFactor: number | null;
  declare frame: string | null;
  declare enclosure: string | null;
  declare manufacturer: string | null;
  declare yearInstalled: number | null;
  declare rewinds: CreationOptional<number>;
  declare controlMethod: (typeof CONTROL_METHODS)[number];
  declare hoursPerYear: number | null;
  declare loadFactor: number | null;
  declare dutyProfile: DutyBin[] | null;
  declare status: CreationOptional<(typeof MOTOR_STATUSES)[number]>;
  declare notes: CreationOptional<string | null>;
  declare importBatchId: CreationOptional<number | null>;
  /** The BLDC design whose part-load curve this motor's BLDC options use (issue 7). */
  declare bldcDesignId: CreationOptional<number | null>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Motor.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false },
        siteId: { type: DataTypes.INTEGER, allowNull: false },
        tag: { type: DataTypes.STRING(60), allowNull: false },
        description: { type: DataTypes.STRING(200), allowNull: true },
        area: { type: DataTypes.STRING(80), allowNull: true },
        application: { type: DataTypes.ENUM(...APPLICATIONS), allowNull: false, defaultValue: 'other' },
        ratedPowerKw: { type: DataTypes.DOUBLE, allowNull: false },
        speedRpm: { type: DataTypes.DOUBLE, allowNull: true },
        poles: { type: DataTypes.INTEGER, allowNull: false },
        voltageV: { type: DataTypes.DOUBLE, allowNull: false },
        frequencyHz: { type: DataTypes.INTEGER, allowNull: false },
        ratedCurrentA: { type: DataTypes.DOUBLE, allowNull: true },
        efficiencyClass: { type: DataTypes.ENUM(...EFFICIENCY_CLASSES), allowNull: false, defaultValue: 'unknown' },
        nameplateEfficiencyPct: { type: DataTypes.DOUBLE, allowNull: true },
        powerFactor: { type: DataTypes.DOUBLE, allowNull: true },
        frame: { type: DataTypes.STRING(20), allowNull: true },
        enclosure: { type: DataTypes.STRING(20), allowNull: true },
        manufacturer: { type: DataTypes.STRING(80), allowNull: true },
        yearInstalled: { type: DataTypes.INTEGER, allowNull: true },
        rewinds: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        controlMethod: { type: DataTypes.ENUM(...CONTROL_METHODS), allowNull: false, defaultValue: 'direct-on-line' },
        hoursPerYear: { type: DataTypes.DOUBLE, allowNull: true },
        loadFactor: { type: DataTypes.DOUBLE, allowNull: true },
        dutyProfile: { type: DataTypes.JSONB, allowNull: true },
        status: { type: DataTypes.ENUM(...MOTOR_STATUSES), allowNull: false, defaultValue: 'in-service' },
        notes: { type: DataTypes.TEXT, allowNull: true },
        importBatchId: { type: DataTypes.INTEGER, allowNull: true },
        bldcDesignId: { type: DataTypes.INTEGER, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'motors', underscored: true },
    );
  }
}
