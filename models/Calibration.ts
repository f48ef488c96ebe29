import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import { CALIBRATION_STATUSES, type CalibrationStatus } from "@/lib/calibration/status";

/**
 * One calibration job of a recording against a scenario's train and entry conditions. `inputs` is what
 * the fit was given ({ scenario, trace }), fixed at start; `result` the fit once done.
 */
export class Calibration extends Model<InferAttributes<Calibration>, InferCreationAttributes<Calibration>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare recordingId: number;
  declare scenarioId: number;
  declare startedBy: number | null;
  declare status: CreationOptional<CalibrationStatus>;
  declare progress: CreationOptional<number>;
  declare options: Record<string, unknown>;
  declare inputs: Record<string, unknown>;
  declare result: CreationOptional<Record<string, unknown> | null>;
  declare error: CreationOptional<string | null>;
  declare errorCode: CreationOptional<string | null>;
  declare runner: CreationOptional<string | null>;
  declare wallTimeMs: CreationOptional<number | null>;
  declare queuedAt: Date;
  declare startedAt: CreationOptional<Date | null>;
  declare finishedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initCalibration(sequelize: Sequelize): typeof Calibration {
  Calibration.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      recordingId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      scenarioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      startedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      status: { type: DataTypes.ENUM(...CALIBRATION_STATUSES), allowNull: false, defaultValue: "queued" },
      progress: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
      options: { type: DataTypes.JSON, allowNull: false },
      inputs: { type: DataTypes.JSON, allowNull: false },
      result: { type: DataTypes.JSON, allowNull: true },
      error: { type: DataTypes.TEXT, allowNull: true },
      errorCode: { type: DataTypes.STRING(40), allowNull: true },
      runner: { type: DataTypes.STRING(120), allowNull: true },
      wallTimeMs: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      queuedAt: { type: DataTypes.DATE(3), allowNull: false },
      startedAt: { type: DataTypes.DATE(3), allowNull: true },
      finishedAt: { type: DataTypes.DATE(3), allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    {
      sequelize,
      tableName: "calibrations",
      modelName: "Calibration",
      underscored: true,
      // The stored trace and fit are large: list queries leave them out unless asked.
      defaultScope: { attributes: { exclude: ["inputs"] } },
      scopes: { withInputs: {} },
    },
  );
  return Calibration;
}
