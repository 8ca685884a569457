import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { BldcResult } from '../../calc/bldc/search.js';

/** A sized BLDC design: the size-bldc input as run (server defaults applied) and calc's result. */
export class BldcDesign extends Model<InferAttributes<BldcDesign>, InferCreationAttributes<BldcDesign>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare motorId: number | null;
  declare name: string;
  declare input: Record<string, unknown>;
  declare appliedDefaults: CreationOptional<string[]>;
  declare result: BldcResult;
  declare ratedPowerKw: number;
  declare speedRpm: number;
  declare feasible: boolean;
  declare createdBy: number | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    BldcDesign.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false },
        motorId: { type: DataTypes.INTEGER, allowNull: true },
        name: { type: DataTypes.STRING(120), allowNull: false },
        input: { type: DataTypes.JSONB, allowNull: false },
        appliedDefaults: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        result: { type: DataTypes.JSONB, allowNull: false },
        ratedPowerKw: { type: DataTypes.DOUBLE, allowNull: false },
        speedRpm: { type: DataTypes.DOUBLE, allowNull: false },
        feasible: { type: DataTypes.BOOLEAN, allowNull: false },
        createdBy: { type: DataTypes.INTEGER, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'bldc_designs', underscored: true },
    );
  }
}
