import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { AssessResult } from '../../calc/assess/assess.js';
import type { AssessInput } from '../../calc/assess/schema.js';

/** A saved quick study: the assess input as computed and calc's result. Immutable once saved. */
export class Study extends Model<InferAttributes<Study>, InferCreationAttributes<Study>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare motorId: number | null;
  declare name: string;
  declare input: AssessInput;
  declare result: AssessResult;
  declare recommendedCode: string;
  declare savingsKwh: number;
  /** NUMERIC: read as a string. */
  declare savingsCost: string | number;
  declare npv: string | number;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Study.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false },
        motorId: { type: DataTypes.INTEGER, allowNull: true },
        name: { type: DataTypes.STRING(120), allowNull: false },
        input: { type: DataTypes.JSONB, allowNull: false },
        result: { type: DataTypes.JSONB, allowNull: false },
        recommendedCode: { type: DataTypes.STRING(20), allowNull: false },
        savingsKwh: { type: DataTypes.DOUBLE, allowNull: false },
        savingsCost: { type: DataTypes.DECIMAL(16, 2), allowNull: false },
        npv: { type: DataTypes.DECIMAL(16, 2), allowNull: false },
        createdBy: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'studies', underscored: true },
    );
  }
}
