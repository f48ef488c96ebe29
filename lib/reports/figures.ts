/** The headline figures of a report's run, labelled and in the report's units: one list for the PDF and the approval summary. */
import { SUMMARY_DEFINITIONS } from "@/sim/summary";
import type { ReportContent } from "./content";
import { fmtN, fmtQ } from "./format";

/** A stored summary value as a report keeps it: numbers (6 significant digits), flags, text, or structures as they are. */
export type ReportSummaryValue = number | boolean | string | null | ReportSummaryValue[] | { [key: string]: ReportSummaryValue };

/** Engine bookkeeping left out of a report. */
const NOT_REPORTED = new Set(["wallTimeMs", "steps", "rhsEvaluations"]);

/**
 * The run's summary for the report: scalar figures rounded to 6 significant digits; structured figures
 * (per-train figures `trains`, the rider-acceleration exposure) kept whole, never squeezed into one number.
 */
export function summaryForReport(summary: Record<string, unknown>): Record<string, ReportSummaryValue> {
  const out: Record<string, ReportSummaryValue> = {};
  for (const [k, v] of Object.entries(summary)) {
    if (NOT_REPORTED.has(k) || v === undefined) continue;
    if (typeof v === "number") out[k] = Number.isFinite(v) ? Number(v.toPrecision(6)) : null;
    else if (v !== null && typeof v === "object") out[k] = JSON.parse(JSON.stringify(v)) as ReportSummaryValue;
    else out[k] = v as boolean | string | null;
  }
  return out;
}

const secs = (v: number | null | undefined) => (v === null || v === undefined || !Number.isFinite(v) ? "—" : `${fmtN(v)} s`);

export function headlineFigures(c: Pick<ReportContent, "run" | "units">): [string, string][] {
  const u = c.units;
  const r = (c.run?.summary ?? {}) as Record<string, number | null | undefined>;
  const has = (k: string) => c.run?.summary !== undefined && k in (c.run?.summary ?? {});
  return [
    ["Peak tension", fmtQ(r.peakTension, "force", u)],
    ["Snatch factor (peak / steady drive tension)", fmtN(r.snatchFactor)],
    ["Lowest safety factor", fmtN(r.minSafetyFactor)],
    ["Load pick-up delay", secs(r.pickupDelay)],
    ["Time to chain speed", secs(r.timeToChainSpeed)],
    ...(has("steadyChainSpeed") ? [["Steady chain speed", fmtQ(r.steadyChainSpeed, "speed", u, 3)] as [string, string]] : []),
    ...(has("surgeAmplitude") ? [["Surge amplitude (train speed, ±)", fmtQ(r.surgeAmplitude, "speed", u, 3)] as [string, string]] : []),
    ...(has("surgeDampingRatio")
      ? [["Surge damping ratio", typeof r.surgeDampingRatio === "number" ? `${(r.surgeDampingRatio * 100).toFixed(1)} %` : "not measured (fewer than three surge peaks)"] as [string, string]]
      : []),
    ["Rollback distance", fmtQ(r.rollbackDistance, "smallLength", u, 1)],
    ["ARD catches", String(r.ardCatches ?? 0)],
    ["Take-up excursion", `${fmtQ(r.takeUpMaxDrop, "smallLength", u, 0)} down, ${fmtQ(r.takeUpMaxRise, "smallLength", u, 0)} up`],
    ["Peak drive power", fmtQ(r.peakDrivePower, "power", u, 1)],
    ["Peak rider acceleration", `${fmtN(r.peakRiderAccel)} g`],
  ];
}

/** Definitions of the figures whose meaning a reader must know to use them, in the engine's own words. */
export function headlineDefinitions(): [string, string][] {
  const d = SUMMARY_DEFINITIONS;
  return [
    ["Snatch factor", d.snatchFactor],
    ["Load pick-up delay", d.pickupDelay],
    ["Time to chain speed", d.timeToChainSpeed],
    ["Steady chain speed", d.steadyChainSpeed],
    ["Surge amplitude", d.surgeAmplitude],
    ["Surge damping ratio", d.surgeDampingRatio],
  ];
}
