/**
 * Scenario files of either format version, and writing a version 2 scenario back as version 1 (only for
 * reverting migration 0017). Pure functions (no server imports).
 *
 * A `tautline-scenario/1` file is converted on read by the engine (`parseScenario` → `upgradeScenario`):
 * its one `train` becomes `trains[0]` and it keeps an ideal drive (prescribed chain speed), no chain loss
 * factor and the contacts version 1 used, so it gives the figures it gave before wherever the physics did
 * not change. Exports always write version 2.
 */
import { SCENARIO_FORMAT, SCENARIO_FORMAT_V1, isV1, parseScenario, type FieldIssue, type Scenario } from "@/sim/schema";

export type FileResult =
  | { ok: true; scenario: Scenario; format: typeof SCENARIO_FORMAT | typeof SCENARIO_FORMAT_V1 }
  | { ok: false; issues: FieldIssue[] };

const isObject = (v: unknown): v is Record<string, unknown> => !!v && typeof v === "object" && !Array.isArray(v);

/** Validates a scenario file of version 2, or of version 1 converted on read; every problem with its path. */
export function readScenarioFile(data: unknown): FileResult {
  const r = parseScenario(data);
  if (!r.ok) return r;
  return { ok: true, scenario: r.scenario, format: isV1(data) ? SCENARIO_FORMAT_V1 : SCENARIO_FORMAT };
}

/** A stored version 1 scenario converted to version 2 (anything else, or a version 1 that no longer validates, is returned as it is). */
export function toFormat2(data: unknown): unknown {
  if (!isV1(data)) return data;
  const r = parseScenario(data);
  return r.ok ? r.scenario : data;
}

/** Fields version 1 does not know, by section (dropped when writing version 1). */
const V2_ONLY: Record<string, string[]> = {
  drive: ["motor", "location", "stop", "restart"],
  chain: ["lossFactor"],
  takeUp: ["damping"],
};

/**
 * A version 2 scenario written as version 1 (for a migration's `down`): `trains[0]` becomes `train`, the
 * contacts go back into `run.contactStiffness` / `run.contactDamping` (the dog's stiffness), and the fields
 * version 1 does not know are dropped (a motor, a stop event, the loss factor, take-up damping, start
 * times and pawls: what they meant is lost). Anything not version 2 is returned as it is.
 */
export function toFormat1(data: unknown): unknown {
  if (!isObject(data) || data.format !== SCENARIO_FORMAT) return data;
  const { trains, contacts, ...rest } = data;
  const out: Record<string, unknown> = { ...rest, format: SCENARIO_FORMAT_V1 };
  for (const [section, keys] of Object.entries(V2_ONLY)) {
    const sec = out[section];
    if (isObject(sec)) out[section] = Object.fromEntries(Object.entries(sec).filter(([k]) => !keys.includes(k)));
  }
  if (isObject(contacts) && isObject(out.run)) {
    out.run = {
      ...out.run,
      ...(typeof contacts.dogStiffness === "number" ? { contactStiffness: contacts.dogStiffness } : {}),
      ...(typeof contacts.dampingRatio === "number" ? { contactDamping: contacts.dampingRatio } : {}),
    };
  }
  const first = Array.isArray(trains) && isObject(trains[0]) ? trains[0] : undefined;
  if (first) {
    // Version 1 has no start time and no pawls (its train has one pawl at the dog).
    out.train = Object.fromEntries(Object.entries(first).filter(([k]) => k !== "startTime" && k !== "pawls"));
  }
  return out;
}
