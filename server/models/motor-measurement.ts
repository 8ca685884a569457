import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A field reading of a motor (input power, speed, current, voltage) for load estimation. */
export class MotorMeasurement extends Model<InferAttributes<MotorMeasurement>, InferCreationAttributes<MotorMeasurement>> {
  declare id: CreationOptional<number>;
  declare organizationId: number;
  declare motorId: number;
  declare measuredAt: Date;
  declare inputPowerKw: number | null;
  declare speedRpm: number | null;
  declare currentA: number | null;
  declare voltageV: number | null;
  declare note: string | null;
  declare userId: number | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    MotorMeasurement.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        organizationId: { type: DataTypes.INTEGER, allowNull: false },
        motorId: { type: DataTypes.INTEGER, allowNull: false },
        measuredAt: { type: DataTypes.DATE, allowNull: false },
        inputPowerKw: { type: DataTypes.DOUBLE, allowNull: true },
        speedRpm: { type: DataTypes.DOUBLE, allowNull: true },
        currentA: { type: DataTypes.DOUBLE, allowNull: true },
        voltageV: { type: DataTypes.DOUBLE, allowNull: true },
        note: { type: DataTypes.STRING(500), allowNull: true },
        userId: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'motor_measurements', underscored: true, updatedAt: false },
    );
  }
}
