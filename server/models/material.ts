import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A custom magnet grade or lamination steel of an organisation's material library. */
export class Material extends Model<InferAttributes<Material>, InferCreationAttributes<Material>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare kind: 'magnet' | 'steel';
  declare name: string;
  /** calc/bldc's MagnetGrade or LaminationSteel fields except the name. */
  declare properties: Record<string, unknown>;
  declare createdBy: number | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Material.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false },
        kind: { type: DataTypes.ENUM('magnet', 'steel'), allowNull: false },
        name: { type: DataTypes.STRING(60), allowNull: false },
        properties: { type: DataTypes.JSONB, allowNull: false },
        createdBy: { type: DataTypes.INTEGER, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'materials', underscored: true },
    );
  }
}
