import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

import { LOADINGS, type Loading } from "@/lib/scenarios/loading";
import type { ScenarioFollower } from "@/lib/scenarios/followers";

export { LOADINGS, type Loading };

/**
 * A case to run: a pinned lift revision + a train + a loading case + entry conditions + run settings.
 * `liftRevisionId` is pinned: editing the lift later does not change this scenario until it is re-pinned.
 * `frozenAt` set (an approved scenario) refuses edits.
 */
export class Scenario extends Model<InferAttributes<Scenario>, InferCreationAttributes<Scenario>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare name: string;
  declare liftId: number;
  declare liftRevisionId: number;
  declare trainId: number;
  declare loading: Loading;
  /** Riders in the whole train, only for loading "riders". */
  declare riderCount: number | null;
  /** m/s */
  declare entrySpeed: number;
  /** m, arc position of the train's front at t = 0 */
  declare startPosition: number;
  /** Engine section `run`. */
  declare runSettings: Record<string, unknown>;
  /** s, when the train appears at its start position (format 2 `trains[].startTime`). */
  declare startTime: CreationOptional<number>;
  /**
   * The scenario's drive model and damping laid over the pinned revision's sections (format 2:
   * drive.motor/location/stop, chain.damping/lossFactor, takeUp.friction/damping, contacts); null = none.
   */
  declare dynamics: Record<string, unknown> | null;
  /**
   * The trains after the lead train (format 2 `trains[1..n]`), each with its own train row, loading and entry
   * conditions (lib/scenarios/schema.ts `followerSchema`); null = the lead train alone.
   */
  declare followers: CreationOptional<ScenarioFollower[] | null>;
  declare notes: string | null;
  declare version: CreationOptional<number>;
  declare archivedAt: Date | null;
  declare frozenAt: Date | null;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initScenario(sequelize: Sequelize): typeof Scenario {
  Scenario.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      name: { type: DataTypes.STRING(200), allowNull: false },
      liftId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      liftRevisionId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      trainId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      loading: { type: DataTypes.ENUM(...LOADINGS), allowNull: false },
      riderCount: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      entrySpeed: { type: DataTypes.DOUBLE, allowNull: false },
      startPosition: { type: DataTypes.DOUBLE, allowNull: false },
      runSettings: { type: DataTypes.JSON, allowNull: false },
      startTime: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
      dynamics: { type: DataTypes.JSON, allowNull: true },
      followers: { type: DataTypes.JSON, allowNull: true },
      notes: { type: DataTypes.TEXT, allowNull: true },
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
      archivedAt: { type: DataTypes.DATE(3), allowNull: true },
      frozenAt: { type: DataTypes.DATE(3), allowNull: true },
      createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: "scenarios", modelName: "Scenario", underscored: true },
  );
  return Scenario;
}
