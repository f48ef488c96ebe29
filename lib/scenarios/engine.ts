/**
 * Scenario rows → the engine's `tautline-scenario/1` object. Plain functions (no server imports), so a
 * browser preview can build the same object the server runs.
 */
import { SCENARIO_FORMAT, parseScenario, type FieldIssue, type Scenario as EngineScenario } from "@/sim/schema";
import type { Loading } from "./loading";
import { carMassFor, ridersFor } from "@/lib/trains/mass";

/** The scenario fields the engine needs (a model row or unsaved data). */
export interface ScenarioLike {
  name: string;
  notes: string | null;
  loading: Loading;
  riderCount: number | null;
  entrySpeed: number;
  startPosition: number;
  runSettings: Record<string, unknown>;
}

/** A lift revision as stored (model row: the `lift` section lives in `geometry`). */
export interface RevisionLike {
  geometry: Record<string, unknown>;
  chain: Record<string, unknown>;
  drive: Record<string, unknown>;
  takeUp: Record<string, unknown>;
  antiRollback: Record<string, unknown>;
  limits: Record<string, unknown> | null;
}

export interface TrainLike {
  cars: number;
  carMassEmpty: number;
  seatsPerCar: number;
  riderMass: number;
  carLength: number;
  dogOffset: number;
  rollingResistance: number;
  dragArea: number;
}

/** The raw `tautline-scenario/1` object, before validation. */
export function engineScenarioInput(scenario: ScenarioLike, revision: RevisionLike, train: TrainLike): Record<string, unknown> {
  const riders = ridersFor(train, scenario.loading, scenario.riderCount);
  return {
    format: SCENARIO_FORMAT,
    name: scenario.name,
    ...(scenario.notes ? { description: scenario.notes } : {}),
    lift: revision.geometry,
    chain: revision.chain,
    drive: revision.drive,
    takeUp: revision.takeUp,
    train: {
      cars: train.cars,
      carMass: carMassFor(train, riders),
      carLength: train.carLength,
      dogOffset: train.dogOffset,
      rollingResistance: train.rollingResistance,
      dragArea: train.dragArea,
      entrySpeed: scenario.entrySpeed,
      startPosition: scenario.startPosition,
    },
    antiRollback: revision.antiRollback,
    run: scenario.runSettings,
    limits: revision.limits ?? {},
  };
}

export type ResolveResult = { ok: true; scenario: EngineScenario } | { ok: false; issues: FieldIssue[] };

/** Builds and validates the engine scenario; every problem is listed with its engine field path. */
export function resolveEngineScenario(scenario: ScenarioLike, revision: RevisionLike, train: TrainLike): ResolveResult {
  return parseScenario(engineScenarioInput(scenario, revision, train));
}

/**
 * Where an engine problem belongs in the scenario's own fields: the entry conditions and run settings
 * map one to one; a train or lift problem points at the train or the pinned revision.
 */
export function toScenarioIssue(issue: FieldIssue): FieldIssue {
  const p = issue.path;
  if (p === "train.entrySpeed") return { path: "entrySpeed", message: issue.message };
  if (p === "train.startPosition") return { path: "startPosition", message: issue.message };
  if (p === "train.carMass") return { path: "loading", message: `with this loading: ${issue.message}` };
  if (p === "run" || p.startsWith("run.")) return { path: p.replace(/^run/, "runSettings"), message: issue.message };
  if (p === "name" || p === "description") return { path: p === "name" ? "name" : "notes", message: issue.message };
  if (p.startsWith("train.")) return { path: "trainId", message: `the train does not fit: ${issue.message}` };
  return { path: "liftRevisionId", message: `the lift revision does not fit: ${issue.message}` };
}
