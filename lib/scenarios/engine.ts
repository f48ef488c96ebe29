/**
 * Scenario rows → the engine's `tautline-scenario/2` object. Plain functions (no server imports), so a
 * browser preview can build the same object the server runs.
 */
import { SCENARIO_FORMAT, parseScenario, type FieldIssue, type Scenario as EngineScenario } from "@/sim/schema";
import type { Loading } from "./loading";
import { carMassFor, ridersFor } from "@/lib/trains/mass";
import { dynamicsPathSet, withDynamics, type Dynamics } from "./dynamics";
import { followerMessage, followerPathOf, storedFollowers, type ScenarioFollower } from "./followers";

/** The scenario fields the engine needs (a model row or unsaved data). */
export interface ScenarioLike {
  name: string;
  notes: string | null;
  loading: Loading;
  riderCount: number | null;
  entrySpeed: number;
  startPosition: number;
  /** s, when the train appears at its start position. */
  startTime?: number | null;
  runSettings: Record<string, unknown>;
  /** The scenario's drive model and damping over the revision's sections (see dynamics.ts). */
  dynamics?: Dynamics | null;
  /** The trains after the lead train (trains[1..n]); absent or null = the lead train alone. */
  followers?: ScenarioFollower[] | null;
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
  /** m behind the front; null/absent = the format's default (one pawl at the dog). */
  pawls?: number[] | null;
}

/** One engine train from a train row, its loading case and its entry conditions. */
function engineTrain(
  train: TrainLike,
  own: { loading: Loading; riderCount?: number | null; entrySpeed: number; startPosition: number; startTime?: number | null },
): Record<string, unknown> {
  const riders = ridersFor(train, own.loading, own.riderCount);
  return {
    cars: train.cars,
    carMass: carMassFor(train, riders),
    carLength: train.carLength,
    dogOffset: train.dogOffset,
    rollingResistance: train.rollingResistance,
    dragArea: train.dragArea,
    entrySpeed: own.entrySpeed,
    startPosition: own.startPosition,
    ...(own.startTime ? { startTime: own.startTime } : {}),
    ...(train.pawls && train.pawls.length ? { pawls: train.pawls } : {}),
  };
}

/**
 * The raw `tautline-scenario/2` object, before validation: the scenario's lead train is `trains[0]`, its
 * followers `trains[1..n]`; `followerTrains[i]` is the train row of `scenario.followers[i]`.
 */
export function engineScenarioInput(
  scenario: ScenarioLike,
  revision: RevisionLike,
  train: TrainLike,
  followerTrains: readonly TrainLike[] = [],
): Record<string, unknown> {
  const followers = storedFollowers(scenario.followers);
  if (followerTrains.length < followers.length)
    throw new Error(`The scenario has ${followers.length} following trains but ${followerTrains.length} train rows were given.`);
  const dyn = scenario.dynamics ?? null;
  const contacts = withDynamics("contacts", undefined, dyn);
  return {
    format: SCENARIO_FORMAT,
    name: scenario.name,
    ...(scenario.notes ? { description: scenario.notes } : {}),
    lift: revision.geometry,
    chain: withDynamics("chain", revision.chain, dyn),
    drive: withDynamics("drive", revision.drive, dyn),
    takeUp: withDynamics("takeUp", revision.takeUp, dyn),
    ...(contacts ? { contacts } : {}),
    trains: [engineTrain(train, scenario), ...followers.map((f, i) => engineTrain(followerTrains[i]!, f))],
    antiRollback: revision.antiRollback,
    run: scenario.runSettings,
    limits: revision.limits ?? {},
  };
}

export type ResolveResult = { ok: true; scenario: EngineScenario } | { ok: false; issues: FieldIssue[] };

/** Builds and validates the engine scenario; every problem is listed with its engine field path. */
export function resolveEngineScenario(scenario: ScenarioLike, revision: RevisionLike, train: TrainLike, followerTrains: readonly TrainLike[] = []): ResolveResult {
  return parseScenario(engineScenarioInput(scenario, revision, train, followerTrains));
}

/**
 * Where an engine problem belongs in the scenario's own fields: the entry conditions, run settings and
 * the scenario's dynamics map one to one; a train or lift problem points at the train or the pinned revision.
 */
export function toScenarioIssue(issue: FieldIssue, dynamics?: Dynamics | null): FieldIssue {
  const p = issue.path;
  // A following train: its entry fields are the scenario's followers.i, the rest belongs to its train row.
  const fp = followerPathOf(p);
  if (fp) {
    const message = followerMessage(issue.message);
    const [, i, field] = /^followers\.(\d+)(?:\.(.*))?$/.exec(fp)!;
    if (field === "entrySpeed" || field === "startPosition" || field === "startTime") return { path: fp, message };
    if (field === "carMass") return { path: `followers.${i}.loading`, message: `with this loading: ${message}` };
    return { path: `followers.${i}.trainId`, message: `the train does not fit: ${message}` };
  }
  // The lead train is trains[0]; its fields are the scenario's entry conditions or the train row.
  const t = p.replace(/^trains\.0(?=\.|$)/, "train");
  if (t === "train.entrySpeed") return { path: "entrySpeed", message: issue.message };
  if (t === "train.startPosition") return { path: "startPosition", message: issue.message };
  if (t === "train.startTime") return { path: "startTime", message: issue.message };
  if (t === "train.carMass") return { path: "loading", message: `with this loading: ${issue.message}` };
  if (t === "train.pawls" || t.startsWith("train.pawls.")) return { path: "trainId", message: `the train's pawls do not fit: ${issue.message}` };
  if (p === "run" || p.startsWith("run.")) return { path: p.replace(/^run/, "runSettings"), message: issue.message };
  if (p === "name" || p === "description") return { path: p === "name" ? "name" : "notes", message: issue.message };
  if (p === "contacts" || p.startsWith("contacts.") || dynamicsPathSet(p, dynamics)) return { path: `dynamics.${p}`, message: issue.message };
  if (t.startsWith("train.") || p === "trains") return { path: "trainId", message: `the train does not fit: ${issue.message}` };
  return { path: "liftRevisionId", message: `the lift revision does not fit: ${issue.message}` };
}
