import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const IMPORT_STATUSES = ['parsing', 'previewed', 'committing', 'committed', 'failed', 'undone'] as const;

export class ImportBatch extends Model<InferAttributes<ImportBatch>, InferCreationAttributes<ImportBatch>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare siteId: number;
  declare userId: number | null;
  declare fileName: string;
  declare status: CreationOptional<(typeof IMPORT_STATUSES)[number]>;
  declare mapping: CreationOptional<Record<string, string | null>>;
  declare totalRows: CreationOptional<number>;
  declare validRows: CreationOptional<number>;
  declare invalidRows: CreationOptional<number>;
  declare createdCount: CreationOptional<number>;
  declare updatedCount: CreationOptional<number>;
  declare committedAt: CreationOptional<Date | null>;
  // Intake columns (migration 20261201140200).
  declare headers: CreationOptional<string[]>;
  declare headerRow: CreationOptional<number>;
  declare sheetName: CreationOptional<string>;
  declare fileKey: CreationOptional<string | null>;
  declare fileSizeBytes: CreationOptional<number>;
  declare warningRows: CreationOptional<number>;
  declare duplicates: CreationOptional<{ inFile: Array<{ tag: string; rows: number[] }>; inRegister: Array<{ tag: string; row: number; motorId: number }> }>;
  declare progress: CreationOptional<number>;
  declare failure: CreationOptional<string | null>;
  declare undoneAt: CreationOptional<Date | null>;
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
        headers: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        headerRow: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
        sheetName: { type: DataTypes.STRING(100), allowNull: false, defaultValue: '' },
        fileKey: { type: DataTypes.STRING(100), allowNull: true },
        fileSizeBytes: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        warningRows: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        duplicates: { type: DataTypes.JSONB, allowNull: false, defaultValue: { inFile: [], inRegister: [] } },
        progress: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
        failure: { type: DataTypes.TEXT, allowNull: true },
        undoneAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'import_batches', underscored: true },
    );
  }
}
