import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { AssumptionsInput, PriceBookInput } from '../../calc/assess/schema.js';

/** One row per organisation: the price book and assumptions its admin stored (null: calc's defaults). */
export class OrganizationSettings extends Model<InferAttributes<OrganizationSettings>, InferCreationAttributes<OrganizationSettings>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare priceBook: CreationOptional<PriceBookInput | null>;
  declare priceBookVersion: CreationOptional<number>;
  declare assumptions: CreationOptional<AssumptionsInput | null>;
  declare assumptionsVersion: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    OrganizationSettings.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false, unique: true },
        priceBook: { type: DataTypes.JSONB, allowNull: true },
        priceBookVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        assumptions: { type: DataTypes.JSONB, allowNull: true },
        assumptionsVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'organization_settings', underscored: true },
    );
  }
}
