import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { RETROFIT_SOURCES, RETROFIT_STATUSES } from '../shared/screening.js';

/** A retrofit of one motor, from proposal on (the Retrofit log takes the later stages). */
export class Retrofit extends Model<InferAttributes<Retrofit>, InferCreationAttributes<Retrofit>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare motorId: number;
  declare optionCode: string;
  declare status: CreationOptional<(typeof RETROFIT_STATUSES)[number]>;
  declare source: (typeof RETROFIT_SOURCES)[number];
  declare jobId: number | null;
  declare predictedSavingsKwh: number;
  /** NUMERIC: read as strings. */
  declare predictedSavingsCost: string | number;
  declare capex: string | number;
  declare npv: string | number;
  declare currency: string;
  declare createdBy: number | null;
  // The Retrofit log's fields (issue 9; migrations 20261201170000 and 20261201170400).
  declare orderDate: CreationOptional<string | null>;
  declare expectedInstallationDate: CreationOptional<string | null>;
  declare installationDate: CreationOptional<string | null>;
  declare actualCapex: CreationOptional<string | number | null>;
  declare rebateReceived: CreationOptional<string | number | null>;
  declare installedEquipment: CreationOptional<Record<string, unknown> | null>;
  declare notes: CreationOptional<string | null>;
  declare statusChangedAt: CreationOptional<Date | null>;
  declare verificationMethod: CreationOptional<'A' | 'B'>;
  declare independentVariable: CreationOptional<string | null>;
  declare stipulatedHoursPerYear: CreationOptional<number | null>;
  declare verifiedSavingsKwh: CreationOptional<number | null>;
  declare verifiedUncertaintyKwh: CreationOptional<number | null>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Retrofit.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false },
        motorId: { type: DataTypes.INTEGER, allowNull: false },
        optionCode: { type: DataTypes.STRING(20), allowNull: false },
        status: { type: DataTypes.ENUM(...RETROFIT_STATUSES), allowNull: false, defaultValue: 'proposed' },
        source: { type: DataTypes.ENUM(...RETROFIT_SOURCES), allowNull: false },
        jobId: { type: DataTypes.INTEGER, allowNull: true },
        predictedSavingsKwh: { type: DataTypes.DOUBLE, allowNull: false },
        predictedSavingsCost: { type: DataTypes.DECIMAL(16, 2), allowNull: false },
        capex: { type: DataTypes.DECIMAL(16, 2), allowNull: false },
        npv: { type: DataTypes.DECIMAL(16, 2), allowNull: false },
        currency: { type: DataTypes.CHAR(3), allowNull: false },
        createdBy: { type: DataTypes.INTEGER, allowNull: true },
        orderDate: { type: DataTypes.DATEONLY, allowNull: true },
        expectedInstallationDate: { type: DataTypes.DATEONLY, allowNull: true },
        installationDate: { type: DataTypes.DATEONLY, allowNull: true },
        actualCapex: { type: DataTypes.DECIMAL(16, 2), allowNull: true },
        rebateReceived: { type: DataTypes.DECIMAL(16, 2), allowNull: true },
        installedEquipment: { type: DataTypes.JSONB, allowNull: true },
        notes: { type: DataTypes.TEXT, allowNull: true },
        statusChangedAt: { type: DataTypes.DATE, allowNull: true },
        verificationMethod: { type: DataTypes.STRING(1), allowNull: false, defaultValue: 'B' },
        independentVariable: { type: DataTypes.STRING(80), allowNull: true },
        stipulatedHoursPerYear: { type: DataTypes.DOUBLE, allowNull: true },
        verifiedSavingsKwh: { type: DataTypes.DOUBLE, allowNull: true },
        verifiedUncertaintyKwh: { type: DataTypes.DOUBLE, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'retrofits', underscored: true },
    );
  }
}
