import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** One row of a recording, SI: s, m (take-up drop, positive down), N, A, m, m/s. */
export class RecordingSample extends Model<InferAttributes<RecordingSample>, InferCreationAttributes<RecordingSample>> {
  declare id: CreationOptional<number>;
  declare recordingId: number;
  declare idx: number;
  declare t: number;
  declare takeUpPosition: number | null;
  declare chainTension: number | null;
  declare driveCurrent: number | null;
  declare trainPosition: number | null;
  declare trainSpeed: number | null;
}

export function initRecordingSample(sequelize: Sequelize): typeof RecordingSample {
  RecordingSample.init(
    {
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      recordingId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      idx: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      t: { type: DataTypes.DOUBLE, allowNull: false },
      takeUpPosition: { type: DataTypes.DOUBLE, allowNull: true },
      chainTension: { type: DataTypes.DOUBLE, allowNull: true },
      driveCurrent: { type: DataTypes.DOUBLE, allowNull: true },
      trainPosition: { type: DataTypes.DOUBLE, allowNull: true },
      trainSpeed: { type: DataTypes.DOUBLE, allowNull: true },
    },
    { sequelize, tableName: "recording_samples", modelName: "RecordingSample", underscored: true, timestamps: false },
  );
  return RecordingSample;
}
