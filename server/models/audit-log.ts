import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class AuditLog extends Model<InferAttributes<AuditLog>, InferCreationAttributes<AuditLog>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare userId: number | null;
  declare action: string;
  declare entity: string;
  declare entityId: number | null;
  declare changes: Record<string, unknown> | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    AuditLog.init(
      {
        id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false },
        userId: { type: DataTypes.INTEGER, allowNull: true },
        action: { type: DataTypes.STRING(40), allowNull: false },
        entity: { type: DataTypes.STRING(40), allowNull: false },
        entityId: { type: DataTypes.INTEGER, allowNull: true },
        changes: { type: DataTypes.JSONB, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'audit_logs', underscored: true, updatedAt: false },
    );
  }
}
