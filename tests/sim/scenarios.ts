/** Scenarios built for the validation tests, each simple enough to have a first-principles answer. */
import example from "@/sim/examples/lift-hill-example.json";
import { parseScenario, type Scenario, type ScenarioV1Input } from "@/sim/schema";

type DeepPartial<T> = { [K in keyof T]?: T[K] extends object ? DeepPartial<T[K]> : T[K] };

/** The example lift as a `tautline-scenario/1` document (read through the version 1 conversion). */
export function exampleInput(): ScenarioV1Input {
  return JSON.parse(JSON.stringify(example)) as ScenarioV1Input;
}

/** Validates a document (either version) into the version 2 scenario, or throws with the first problem. */
export function parsed(data: unknown): Scenario {
  const r = parseScenario(data);
  if (!r.ok) throw new Error(`${r.issues[0].path}: ${r.issues[0].message}`);
  return r.scenario;
}

/** The version 1 example with sections overridden field by field, validated and converted to version 2. */
export function scenario(over: DeepPartial<ScenarioV1Input> = {}): Scenario {
  const base = exampleInput() as unknown as Record<string, Record<string, unknown>>;
  for (const [k, v] of Object.entries(over)) {
    if (v && typeof v === "object") base[k] = { ...(base[k] ?? {}), ...(v as Record<string, unknown>) };
    else (base as Record<string, unknown>)[k] = v;
  }
  return parsed(base);
}

export const G = 9.80665;

/**
 * A train standing on a long straight incline, its pawl on an ARD tooth and a catch point 1 mm behind
 * the dog; the drive ramps gently to a slow speed. No guide friction or drag, so the load at the dog is
 * exactly weight component + rolling resistance.
 */
export function standingTrain(over: DeepPartial<ScenarioV1Input> = {}): Scenario {
  const approach = 10;
  const sag = 20;
  const angle = 30;
  const th = (angle * Math.PI) / 180;
  const inclineStart = approach + sag * th;
  const front = inclineStart + 20; // whole train (15.6 m) on the incline
  const dogOffset = 1.3;
  const dog = front - dogOffset;
  const arFrom = dog - 10 * 0.15; // the pawl sits exactly on a tooth
  const s = {
    lift: { approachLength: approach, sagRadius: sag, angle, inclineLength: 120, crestRadius: 20, exitLength: 20, chainFrom: 5, chainTo: inclineStart + 120, dogRelease: inclineStart + 119, bottomRun: 4 },
    chain: { massPerLength: 5, axialStiffness: 1.5e7, catchOffset: dog - 0.005, guideFriction: 0, damping: 2000 },
    drive: { speed: 0.5, rampTime: 0.5 },
    train: { cars: 6, carMass: 1300, carLength: 2.6, dogOffset, rollingResistance: 0.015, dragArea: 0, entrySpeed: 0, startPosition: front },
    antiRollback: { from: arFrom, to: inclineStart + 115, toothSpacing: 0.15 },
    run: { duration: 12, segments: 60 },
  };
  return scenario(merge(s, over));
}

function merge<T extends Record<string, unknown>>(a: T, b: Record<string, unknown>): T {
  const out: Record<string, unknown> = { ...a };
  for (const [k, v] of Object.entries(b)) {
    out[k] = v && typeof v === "object" && !Array.isArray(v) ? { ...((a[k] as object) ?? {}), ...(v as object) } : v;
  }
  return out as T;
}
