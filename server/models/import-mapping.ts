import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A column mapping remembered for an organisation: normalised header → motor field (null: ignore). */
export class ImportMapping extends Model<InferAttributes<ImportMapping>, InferCreationAttributes<ImportMapping>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare headerKey: string;
  declare field: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    ImportMapping.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false },
        headerKey: { type: DataTypes.STRING(200), allowNull: false },
        field: { type: DataTypes.STRING(40), allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'import_mappings', underscored: true },
    );
  }
}
