import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const IMPORT_STATUSES = ['parsing', 'previewed', 'committing', 'committed', 'failed', 'undone'] as const;

export class ImportBatch extends Model<InferAttributes<ImportBatch>, InferCreationAttributes<ImportBatch>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare siteId: number;
  declare userId: number | null;
  declare fileName: string;
  declare status: CreationOptional<(typeof IMPORT_STATUSES)[number]>;
  declare mapping: CreationOptional<Record<string, string>>;
  declare totalRows: CreationOptional<number>;
  declare validRows: CreationOptional<number>;
  declare invalidRows: CreationOptional<number>;
  declare createdCount: CreationOptional<number>;
  declare updatedCount: CreationOptional<number>;
  declare committedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    ImportBatch.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false },
        siteId: { type: DataTypes.INTEGER, allowNull: false },
        userId: { type: DataTypes.INTEGER, allowNull: true },
        fileName: { type: DataTypes.STRING(255), allowNull: false },
        status: { type: DataTypes.ENUM(...IMPORT_STATUSES), allowNull: false, defaultValue: 'parsing' },
        mapping: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        totalRows: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        validRows: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        invalidRows: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdCount: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        updatedCount: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        committedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'import_batches', underscored: true },
    );
  }
}
