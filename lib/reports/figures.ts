/** The headline figures of a report's run, labelled and in the report's units: one list for the PDF and the approval summary. */
import type { ReportContent } from "./content";
import { fmtN, fmtQ } from "./format";

export function headlineFigures(c: Pick<ReportContent, "run" | "units">): [string, string][] {
  const u = c.units;
  const r = (c.run?.summary ?? {}) as Record<string, number | null | undefined>;
  return [
    ["Peak tension", fmtQ(r.peakTension, "force", u)],
    ["Snatch factor", fmtN(r.snatchFactor)],
    ["Lowest safety factor", fmtN(r.minSafetyFactor)],
    ["Load pick-up delay", r.pickupDelay === null || r.pickupDelay === undefined ? "—" : `${fmtN(r.pickupDelay)} s`],
    ["Rollback distance", fmtQ(r.rollbackDistance, "shortLength", u, 1)],
    ["ARD catches", String(r.ardCatches ?? 0)],
    ["Take-up excursion", `${fmtQ(r.takeUpMaxDrop, "shortLength", u, 0)} down, ${fmtQ(r.takeUpMaxRise, "shortLength", u, 0)} up`],
    ["Peak drive power", fmtQ(r.peakDrivePower, "power", u, 1)],
    ["Peak rider acceleration", `${fmtN(r.peakRiderAccel)} g`],
  ];
}
