import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { CASE_SCOPES, CASE_STATUSES, type CaseResults, type CaseSummary } from '../shared/case.js';

/** What a snapshot was computed from (stored, never sent whole: it can hold thousands of motors). */
export interface CaseInputs {
  sites: Array<{ id: number; name: string; currency: string; input: unknown }>;
  motors: Array<{ id: number; siteId: number; tag: string; bldcDesignId: number | null; version: number; input: unknown }>;
  priceBook: unknown;
  assumptions: unknown;
  sources: string[];
}

/** An immutable business-case snapshot; only status, decision and last sending change later. */
export class BusinessCase extends Model<InferAttributes<BusinessCase>, InferCreationAttributes<BusinessCase>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare scope: (typeof CASE_SCOPES)[number];
  declare siteId: number | null;
  declare version: number;
  declare status: CreationOptional<(typeof CASE_STATUSES)[number]>;
  declare title: string;
  declare currency: string;
  declare headline: CaseSummary['headline'];
  declare inputs: CaseInputs;
  declare results: CaseResults;
  declare createdBy: number | null;
  declare decidedBy: CreationOptional<number | null>;
  declare decidedAt: CreationOptional<Date | null>;
  declare decisionComment: CreationOptional<string | null>;
  declare lastSentAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    BusinessCase.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false },
        scope: { type: DataTypes.ENUM(...CASE_SCOPES), allowNull: false },
        siteId: { type: DataTypes.INTEGER, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false },
        status: { type: DataTypes.ENUM(...CASE_STATUSES), allowNull: false, defaultValue: 'draft' },
        title: { type: DataTypes.STRING(200), allowNull: false },
        currency: { type: DataTypes.CHAR(3), allowNull: false },
        headline: { type: DataTypes.JSONB, allowNull: false },
        inputs: { type: DataTypes.JSONB, allowNull: false },
        results: { type: DataTypes.JSON, allowNull: false },
        createdBy: { type: DataTypes.INTEGER, allowNull: true },
        decidedBy: { type: DataTypes.INTEGER, allowNull: true },
        decidedAt: { type: DataTypes.DATE, allowNull: true },
        decisionComment: { type: DataTypes.TEXT, allowNull: true },
        lastSentAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'business_cases', underscored: true },
    );
  }
}

/** One e-mailing of a business case. */
export class CaseSend extends Model<InferAttributes<CaseSend>, InferCreationAttributes<CaseSend>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare caseId: number;
  declare sentBy: number | null;
  declare toAddresses: string[];
  declare messageId: string | null;
  declare sentAt: Date;

  static initModel(sequelize: Sequelize): void {
    CaseSend.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false },
        caseId: { type: DataTypes.INTEGER, allowNull: false },
        sentBy: { type: DataTypes.INTEGER, allowNull: true },
        toAddresses: { type: DataTypes.JSONB, allowNull: false },
        messageId: { type: DataTypes.STRING(300), allowNull: true },
        sentAt: { type: DataTypes.DATE, allowNull: false },
      },
      { sequelize, tableName: 'case_sends', underscored: true, timestamps: false },
    );
  }
}
