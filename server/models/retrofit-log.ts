import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { MeterGap, MeterPoint, MeterPeriod, MeterRegister, MeterScope, MeterUnit, RetrofitFileKind, RetrofitStatus } from '../shared/retrofit.js';

/** One transition of a retrofit (the creation too, with fromStatus null): who, when, comment. */
export class RetrofitEvent extends Model<InferAttributes<RetrofitEvent>, InferCreationAttributes<RetrofitEvent>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare retrofitId: number;
  declare fromStatus: RetrofitStatus | null;
  declare toStatus: RetrofitStatus;
  declare userId: number | null;
  declare comment: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    RetrofitEvent.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false },
        retrofitId: { type: DataTypes.INTEGER, allowNull: false },
        fromStatus: { type: DataTypes.STRING(20), allowNull: true },
        toStatus: { type: DataTypes.STRING(20), allowNull: false },
        userId: { type: DataTypes.INTEGER, allowNull: true },
        comment: { type: DataTypes.TEXT, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'retrofit_events', underscored: true, updatedAt: false },
    );
  }
}

/** A document or photo of a retrofit; the bytes live under UPLOAD_DIR as `storageKey`. */
export class RetrofitFile extends Model<InferAttributes<RetrofitFile>, InferCreationAttributes<RetrofitFile>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare retrofitId: number;
  declare kind: RetrofitFileKind;
  declare fileName: string;
  declare contentType: 'image/jpeg' | 'image/png' | 'image/webp' | 'application/pdf';
  declare sizeBytes: number;
  declare storageKey: string;
  declare sha256: string;
  declare userId: number | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    RetrofitFile.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false },
        retrofitId: { type: DataTypes.INTEGER, allowNull: false },
        kind: { type: DataTypes.STRING(20), allowNull: false },
        fileName: { type: DataTypes.STRING(255), allowNull: false },
        contentType: { type: DataTypes.STRING(60), allowNull: false },
        sizeBytes: { type: DataTypes.INTEGER, allowNull: false },
        storageKey: { type: DataTypes.STRING(100), allowNull: false },
        sha256: { type: DataTypes.STRING(64), allowNull: false },
        userId: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'retrofit_files', underscored: true, updatedAt: false },
    );
  }
}

/** The accepted meter data of one period of a retrofit, as a compact series. */
export class RetrofitMeterData extends Model<InferAttributes<RetrofitMeterData>, InferCreationAttributes<RetrofitMeterData>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare retrofitId: number;
  declare period: MeterPeriod;
  declare unit: MeterUnit;
  declare register: MeterRegister;
  declare scope: MeterScope;
  declare fileName: string;
  declare variableName: string | null;
  declare utcOffset: string | null;
  declare intervalMinutes: number;
  declare rows: number;
  declare points: MeterPoint[];
  declare gaps: MeterGap[];
  declare userId: number | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    RetrofitMeterData.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false },
        retrofitId: { type: DataTypes.INTEGER, allowNull: false },
        period: { type: DataTypes.STRING(10), allowNull: false },
        unit: { type: DataTypes.STRING(4), allowNull: false },
        register: { type: DataTypes.STRING(12), allowNull: false },
        scope: { type: DataTypes.STRING(8), allowNull: false },
        fileName: { type: DataTypes.STRING(255), allowNull: false },
        variableName: { type: DataTypes.STRING(80), allowNull: true },
        utcOffset: { type: DataTypes.STRING(6), allowNull: true },
        intervalMinutes: { type: DataTypes.DOUBLE, allowNull: false },
        rows: { type: DataTypes.INTEGER, allowNull: false },
        points: { type: DataTypes.JSONB, allowNull: false },
        gaps: { type: DataTypes.JSONB, allowNull: false },
        userId: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'retrofit_meter_data', underscored: true, updatedAt: false },
    );
  }
}
