/**
 * What-if overrides of a run: which scenario field each one replaces, and applying them. Pure (no DB, no
 * Node APIs) so the run view's sliders and the server build the same scenario from the same values.
 */
import type { Scenario } from "@/sim/schema";
import { RUN_OVERRIDE_KEYS, type RunOverrideKey, type RunOverrides } from "./schema";

export { RUN_OVERRIDE_KEYS, type RunOverrideKey, type RunOverrides };

/** The scenario field behind each override, its label and the quantity it is shown as. */
export const OVERRIDE_FIELDS: Record<RunOverrideKey, { path: string; label: string; quantity: "speed" | "mass" }> = {
  entrySpeed: { path: "trains.0.entrySpeed", label: "entry speed", quantity: "speed" },
  chainSpeed: { path: "drive.speed", label: "chain speed", quantity: "speed" },
  takeUpMass: { path: "takeUp.mass", label: "take-up mass", quantity: "mass" },
};

/** The scenario's own values of the overridable fields (SI); the entry speed is the first train's. */
export function overridableValues(s: Scenario): Record<RunOverrideKey, number> {
  return { entrySpeed: s.trains[0]!.entrySpeed, chainSpeed: s.drive.speed, takeUpMass: s.takeUp.mass };
}

/**
 * The scenario with the given overrides in place of its own values; keys left out keep the scenario's.
 * An entry speed applies to every train of the scenario.
 */
export function applyOverrides(s: Scenario, o: RunOverrides): Scenario {
  const entry = o.entrySpeed;
  return {
    ...s,
    trains: entry !== undefined ? s.trains.map((t) => ({ ...t, entrySpeed: entry })) : s.trains,
    drive: o.chainSpeed !== undefined ? { ...s.drive, speed: o.chainSpeed } : s.drive,
    takeUp: o.takeUpMass !== undefined ? { ...s.takeUp, mass: o.takeUpMass } : s.takeUp,
  };
}

/** Only the overrides that differ from the scenario (what a what-if actually changes); null when none. */
export function changedOverrides(s: Scenario, o: RunOverrides): RunOverrides | null {
  const own = overridableValues(s);
  const out: RunOverrides = {};
  for (const k of RUN_OVERRIDE_KEYS) if (o[k] !== undefined && o[k] !== own[k]) out[k] = o[k];
  return Object.keys(out).length ? out : null;
}
