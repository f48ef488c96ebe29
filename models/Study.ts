import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";
import type { RunStatus } from "@/lib/runs/status";

/** A design study: one scenario varied over one or two parameters (definition in lib/studies/schema.ts). */
export class Study extends Model<InferAttributes<Study>, InferCreationAttributes<Study>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare scenarioId: number;
  declare liftRevisionId: number;
  declare name: string;
  /** The study's parameter axes (StudyParameter[]). */
  declare parameters: unknown[];
  /** Run overrides, frame budget and acceptance criteria (StudySettings). */
  declare settings: Record<string, unknown>;
  declare status: CreationOptional<RunStatus>;
  /** "pool" (worker threads in the server) or "queue" (BullMQ on Redis). */
  declare mode: CreationOptional<string>;
  declare casesTotal: CreationOptional<number>;
  declare casesDone: CreationOptional<number>;
  declare casesFailed: CreationOptional<number>;
  /** The process driving the study's cases in pool mode (runner id), null in queue mode. */
  declare driver: string | null;
  declare createdBy: number | null;
  declare startedAt: Date | null;
  declare finishedAt: Date | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initStudy(sequelize: Sequelize): typeof Study {
  Study.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      scenarioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      liftRevisionId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      name: { type: DataTypes.STRING(200), allowNull: false },
      parameters: { type: DataTypes.JSON, allowNull: false },
      settings: { type: DataTypes.JSON, allowNull: false },
      status: { type: DataTypes.ENUM("queued", "running", "done", "failed", "cancelled"), allowNull: false, defaultValue: "queued" },
      mode: { type: DataTypes.STRING(16), allowNull: false, defaultValue: "pool" },
      casesTotal: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      casesDone: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      casesFailed: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      driver: { type: DataTypes.STRING(120), allowNull: true },
      createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      startedAt: { type: DataTypes.DATE(3), allowNull: true },
      finishedAt: { type: DataTypes.DATE(3), allowNull: true },
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: "studies", modelName: "Study", underscored: true },
  );
  return Study;
}
