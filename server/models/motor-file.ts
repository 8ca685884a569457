import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A nameplate photo or document of a motor; the bytes live under UPLOAD_DIR as `storageKey`. */
export class MotorFile extends Model<InferAttributes<MotorFile>, InferCreationAttributes<MotorFile>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare motorId: number;
  declare kind: 'nameplate-photo' | 'document';
  declare fileName: string;
  declare contentType: 'image/jpeg' | 'image/png' | 'image/webp' | 'application/pdf';
  declare sizeBytes: number;
  declare storageKey: string;
  declare sha256: string;
  declare userId: number | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    MotorFile.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false },
        motorId: { type: DataTypes.INTEGER, allowNull: false },
        kind: { type: DataTypes.STRING(20), allowNull: false },
        fileName: { type: DataTypes.STRING(255), allowNull: false },
        contentType: { type: DataTypes.STRING(60), allowNull: false },
        sizeBytes: { type: DataTypes.INTEGER, allowNull: false },
        storageKey: { type: DataTypes.STRING(100), allowNull: false },
        sha256: { type: DataTypes.STRING(64), allowNull: false },
        userId: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'motor_files', underscored: true, updatedAt: false },
    );
  }
}
