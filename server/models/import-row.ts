import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { RowIssue } from '../shared/intake.js';

/** A staging row of an import batch. Reached only through its batch, which is organisation-scoped. */
export class ImportRow extends Model<InferAttributes<ImportRow>, InferCreationAttributes<ImportRow>> {
  declare id: CreationOptional<number>;
  declare batchId: number;
  /** Spreadsheet row number the user sees. */
  declare rowNumber: number;
  declare cells: Array<string | number | null>;
  declare values: Record<string, unknown>;
  declare errors: RowIssue[];
  declare warnings: RowIssue[];
  declare valid: boolean;
  declare action: 'create' | 'update' | 'skip';
  declare motorId: number | null;
  /** The motor's values before the commit updated it (column previous), for undo. */
  declare previousValues: Record<string, unknown> | null;

  static initModel(sequelize: Sequelize): void {
    ImportRow.init(
      {
        id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
        batchId: { type: DataTypes.INTEGER, allowNull: false },
        rowNumber: { type: DataTypes.INTEGER, allowNull: false },
        cells: { type: DataTypes.JSONB, allowNull: false },
        values: { type: DataTypes.JSONB, allowNull: false },
        errors: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        warnings: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        valid: { type: DataTypes.BOOLEAN, allowNull: false },
        action: { type: DataTypes.STRING(10), allowNull: false },
        motorId: { type: DataTypes.INTEGER, allowNull: true },
        previousValues: { type: DataTypes.JSONB, allowNull: true, field: 'previous' },
      },
      { sequelize, tableName: 'import_rows', underscored: true, timestamps: false },
    );
  }
}
