import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";
import type { Organisation } from "./Organisation";
import type { User } from "./User";
import { RUN_STATUSES, type RunStatus } from "@/lib/runs/status";
import type { RunOverrideKey } from "@/lib/runs/schema";

export { RUN_STATUSES, type RunStatus };

/**
 * One run of the engine on a scenario. `inputs` is the full resolved engine scenario that was run and
 * `liftRevisionId` the revision it came from: both are fixed at start and never rewritten. A what-if run
 * also keeps its `overrides` (already applied in `inputs`) and the scenario values they replaced.
 * `result` is the gzipped `tautline-result/1` blob (lib/runs/result-format.ts).
 */
export class Run extends Model<InferAttributes<Run>, InferCreationAttributes<Run>> {
  declare id: CreationOptional<number>;
  declare organisationId: ForeignKey<Organisation["id"]>;
  declare scenarioId: number;
  declare liftRevisionId: number;
  declare status: CreationOptional<RunStatus>;
  declare progress: CreationOptional<number>;
  declare startedBy: ForeignKey<User["id"]> | null;
  declare inputs: Record<string, unknown>;
  declare solver: Record<string, unknown>;
  /** What-if values the run used instead of the scenario's (SI; null for a plain run). */
  declare overrides: CreationOptional<Partial<Record<RunOverrideKey, number>> | null>;
  /** The scenario's own values those overrides replaced, as they were when the run started. */
  declare overridesFrom: CreationOptional<Partial<Record<RunOverrideKey, number>> | null>;
  declare summary: CreationOptional<Record<string, unknown> | null>;
  declare diagnostics: CreationOptional<Record<string, unknown> | null>;
  declare result: CreationOptional<Buffer | null>;
  declare resultFormat: CreationOptional<string | null>;
  declare resultBytes: CreationOptional<number | null>;
  declare wallTimeMs: CreationOptional<number | null>;
  declare error: CreationOptional<string | null>;
  declare errorCode: CreationOptional<string | null>;
  declare runner: CreationOptional<string | null>;
  declare queuedAt: Date;
  declare startedAt: CreationOptional<Date | null>;
  declare finishedAt: CreationOptional<Date | null>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initRun(sequelize: Sequelize): typeof Run {
  Run.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      scenarioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      liftRevisionId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      status: { type: DataTypes.ENUM(...RUN_STATUSES), allowNull: false, defaultValue: "queued" },
      progress: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
      startedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      inputs: { type: DataTypes.JSON, allowNull: false },
      solver: { type: DataTypes.JSON, allowNull: false },
      overrides: { type: DataTypes.JSON, allowNull: true },
      overridesFrom: { type: DataTypes.JSON, allowNull: true },
      summary: { type: DataTypes.JSON, allowNull: true },
      diagnostics: { type: DataTypes.JSON, allowNull: true },
      result: { type: DataTypes.BLOB("long"), allowNull: true },
      resultFormat: { type: DataTypes.STRING(32), allowNull: true },
      resultBytes: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      wallTimeMs: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      error: { type: DataTypes.TEXT, allowNull: true },
      errorCode: { type: DataTypes.STRING(40), allowNull: true },
      runner: { type: DataTypes.STRING(120), allowNull: true },
      queuedAt: { type: DataTypes.DATE(3), allowNull: false },
      startedAt: { type: DataTypes.DATE(3), allowNull: true },
      finishedAt: { type: DataTypes.DATE(3), allowNull: true },
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    {
      sequelize,
      tableName: "runs",
      modelName: "Run",
      underscored: true,
      // The result blob is large: list queries leave it out unless they ask for it.
      defaultScope: { attributes: { exclude: ["result"] } },
      scopes: { withResult: {} },
    },
  );
  return Run;
}
