import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** A logger recording of one dispatch, attached to a lift revision; samples in recording_samples (SI). */
export class Recording extends Model<InferAttributes<Recording>, InferCreationAttributes<Recording>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare liftId: number;
  declare liftRevisionId: number;
  declare uploadId: number | null;
  declare name: string;
  declare mapping: Record<string, unknown>;
  declare channels: string[];
  declare sampleCount: number;
  declare duration: number;
  declare engagementTime: number | null;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initRecording(sequelize: Sequelize): typeof Recording {
  Recording.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      liftId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      liftRevisionId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      uploadId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      name: { type: DataTypes.STRING(200), allowNull: false },
      mapping: { type: DataTypes.JSON, allowNull: false },
      channels: { type: DataTypes.JSON, allowNull: false },
      sampleCount: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      duration: { type: DataTypes.DOUBLE, allowNull: false },
      engagementTime: { type: DataTypes.DOUBLE, allowNull: true },
      createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: "recordings", modelName: "Recording", underscored: true },
  );
  return Recording;
}
