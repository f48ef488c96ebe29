import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";
import type { RunStatus } from "@/lib/runs/status";

/** One case of a study: its parameter values, its run, and the figures and checks copied from the run. */
export class StudyCase extends Model<InferAttributes<StudyCase>, InferCreationAttributes<StudyCase>> {
  declare id: CreationOptional<number>;
  declare studyId: number;
  declare organisationId: number;
  /** Position in the study's grid (0-based, first parameter slowest). */
  declare idx: number;
  /** Parameter key → value (SI, or a chain spec id / loading name). */
  declare values: Record<string, number | string>;
  declare status: CreationOptional<RunStatus>;
  declare runId: number | null;
  declare headline: Record<string, number | null> | null;
  declare checks: unknown[] | null;
  declare acceptable: boolean | null;
  declare error: string | null;
  declare wallTimeMs: number | null;
  declare finishedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initStudyCase(sequelize: Sequelize): typeof StudyCase {
  StudyCase.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      idx: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      values: { type: DataTypes.JSON, allowNull: false },
      status: { type: DataTypes.ENUM("queued", "running", "done", "failed", "cancelled"), allowNull: false, defaultValue: "queued" },
      runId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      headline: { type: DataTypes.JSON, allowNull: true },
      checks: { type: DataTypes.JSON, allowNull: true },
      acceptable: { type: DataTypes.BOOLEAN, allowNull: true },
      error: { type: DataTypes.TEXT, allowNull: true },
      wallTimeMs: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      finishedAt: { type: DataTypes.DATE(3), allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: "study_cases", modelName: "StudyCase", underscored: true },
  );
  return StudyCase;
}
