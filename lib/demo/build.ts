/**
 * Turns the demo park's definitions (park.ts) into validated rows and engine scenarios, without a
 * database: the seed stores exactly these, and the public/scenarios/*.json files are exactly these.
 */
import { liftRevisionSchema, type LiftRevisionData } from "@/lib/lifts/schema";
import { trainFields, trainInputSchema, type TrainData } from "@/lib/trains/schema";
import { engineScenarioInput } from "@/lib/scenarios/resolve";
import { parseScenario, runSettingsSchema, type Scenario as EngineScenario } from "@/sim/schema";
import { DEMO_SCENARIOS, demoLift, demoTrain, type DemoLift, type DemoScenario } from "./park";

function fail(what: string, issues: { path: string; message: string }[]): never {
  throw new Error(`Demo ${what} is invalid: ${issues.map((i) => `${i.path}: ${i.message}`).join("; ")}`);
}

function zodIssues(e: { issues: { path: PropertyKey[]; message: string }[] }) {
  return e.issues.map((i) => ({ path: i.path.map(String).join("."), message: i.message }));
}

/** Revision `number` (1-based) of a demo lift, validated as the lift API validates a revision. */
export function demoRevisionData(lift: DemoLift, number: number): LiftRevisionData {
  const r = lift.revisions[number - 1];
  if (!r) throw new Error(`Demo lift ${lift.key} has no revision ${number}`);
  const parsed = liftRevisionSchema.safeParse({
    name: lift.name,
    site: lift.site,
    notes: lift.notes,
    chainSpecId: null,
    lift: r.geometry,
    chain: r.chain,
    drive: r.drive,
    takeUp: r.takeUp,
    antiRollback: r.antiRollback,
    limits: r.limits ?? {},
  });
  if (!parsed.success) fail(`lift ${lift.key} revision ${number}`, zodIssues(parsed.error));
  return parsed.data;
}

export function demoTrainData(key: string): TrainData {
  const t = demoTrain(key);
  const parsed = trainInputSchema.safeParse(trainFields(t));
  if (!parsed.success) fail(`train ${key}`, zodIssues(parsed.error));
  return parsed.data;
}

/** The scenario row's own fields (run settings with the engine's defaults filled in). */
export function demoScenarioFields(s: DemoScenario) {
  const run = runSettingsSchema.safeParse(s.runSettings);
  if (!run.success) fail(`scenario ${s.key} run settings`, zodIssues(run.error));
  return {
    name: s.name,
    notes: s.notes,
    loading: s.loading,
    riderCount: s.loading === "riders" ? (s.riderCount ?? 0) : null,
    entrySpeed: s.entrySpeed,
    startPosition: s.startPosition,
    startTime: s.startTime ?? 0,
    runSettings: run.data as unknown as Record<string, unknown>,
    dynamics: s.dynamics ?? null,
  };
}

/**
 * The `tautline-scenario/2` object of a demo scenario with only the values park.ts gives (the engine's
 * defaults are left out, so the public files stay valid and unchanged when a default changes).
 */
export function demoScenarioInput(s: DemoScenario): Record<string, unknown> {
  const lift = demoLift(s.lift);
  const r = lift.revisions[s.revision - 1];
  if (!r) throw new Error(`Demo lift ${lift.key} has no revision ${s.revision}`);
  const followers = s.followers ?? [];
  const input = engineScenarioInput(
    { ...demoScenarioFields(s), runSettings: s.runSettings, followers: followers.map((f) => ({ ...f, trainId: 0, riderCount: f.riderCount ?? null })) },
    { geometry: r.geometry, chain: r.chain, drive: r.drive, takeUp: r.takeUp, antiRollback: r.antiRollback, limits: r.limits ?? null },
    demoTrainData(s.train),
    followers.map((f) => demoTrainData(f.train)),
  );
  if (!r.limits) delete input.limits;
  return input;
}

/** The full, validated engine scenario of a demo scenario (defaults filled in): what its seeded run ran. */
export function demoEngineScenario(s: DemoScenario): EngineScenario {
  const parsed = parseScenario(demoScenarioInput(s));
  if (!parsed.ok) fail(`scenario ${s.key}`, parsed.issues);
  return parsed.scenario;
}

export function demoScenario(key: string): DemoScenario {
  const s = DEMO_SCENARIOS.find((x) => x.key === key);
  if (!s) throw new Error(`No demo scenario ${key}`);
  return s;
}
