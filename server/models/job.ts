import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { JOB_STATUSES, type JobStatus } from '../shared/screening.js';

/** A background job in the PostgreSQL queue (server/jobs/runner.ts). */
export class Job extends Model<InferAttributes<Job>, InferCreationAttributes<Job>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare kind: string;
  declare status: CreationOptional<JobStatus>;
  declare progress: CreationOptional<number>;
  declare params: Record<string, unknown>;
  declare result: CreationOptional<unknown>;
  declare error: CreationOptional<string | null>;
  declare attempts: CreationOptional<number>;
  declare lockedBy: CreationOptional<string | null>;
  declare heartbeatAt: CreationOptional<Date | null>;
  declare createdBy: number | null;
  declare startedAt: CreationOptional<Date | null>;
  declare finishedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Job.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false },
        kind: { type: DataTypes.STRING(40), allowNull: false },
        status: { type: DataTypes.ENUM(...JOB_STATUSES), allowNull: false, defaultValue: 'queued' },
        progress: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
        params: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        result: { type: DataTypes.JSONB, allowNull: true },
        error: { type: DataTypes.TEXT, allowNull: true },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        lockedBy: { type: DataTypes.STRING(80), allowNull: true },
        heartbeatAt: { type: DataTypes.DATE, allowNull: true },
        createdBy: { type: DataTypes.INTEGER, allowNull: true },
        startedAt: { type: DataTypes.DATE, allowNull: true },
        finishedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'jobs', underscored: true },
    );
  }
}
