import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export interface TimeOfUseBand {
  name: string;
  pricePerKwh: number;
  shareOfHoursPct: number;
}

export class Site extends Model<InferAttributes<Site>, InferCreationAttributes<Site>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare name: string;
  declare code: string | null;
  declare location: string | null;
  declare voltageV: number;
  declare frequencyHz: number;
  /** NUMERIC: Sequelize reads it as a string so no cent is lost to floating point. */
  declare energyPricePerKwh: string | number;
  declare timeOfUse: CreationOptional<TimeOfUseBand[]>;
  declare demandChargePerKwMonth: string | number;
  declare currency: string;
  declare co2KgPerKwh: number;
  declare defaultHoursPerYear: number;
  declare archivedAt: CreationOptional<Date | null>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Site.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false },
        name: { type: DataTypes.STRING(120), allowNull: false },
        code: { type: DataTypes.STRING(20), allowNull: true },
        location: { type: DataTypes.STRING(200), allowNull: true },
        voltageV: { type: DataTypes.DOUBLE, allowNull: false },
        frequencyHz: { type: DataTypes.INTEGER, allowNull: false },
        energyPricePerKwh: { type: DataTypes.DECIMAL(14, 6), allowNull: false },
        timeOfUse: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        demandChargePerKwMonth: { type: DataTypes.DECIMAL(14, 4), allowNull: false, defaultValue: 0 },
        currency: { type: DataTypes.CHAR(3), allowNull: false },
        co2KgPerKwh: { type: DataTypes.DOUBLE, allowNull: false },
        defaultHoursPerYear: { type: DataTypes.INTEGER, allowNull: false },
        archivedAt: { type: DataTypes.DATE, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'sites', underscored: true },
    );
  }
}
