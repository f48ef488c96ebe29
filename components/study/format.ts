import { toDisplay, unitOf, type Quantity, type UnitSystem } from "@/lib/client/units";
import { PARAMETER_LABELS, type StudyParameterKey } from "@/lib/studies/schema";

/** Headline columns of the case table and plots: key, label, quantity for units (null = plain number). */
export const FIGURES: { key: string; label: string; quantity: Quantity | null; digits: number }[] = [
  { key: "peakTension", label: "Peak tension", quantity: "force", digits: 1 },
  { key: "snatchFactor", label: "Snatch factor", quantity: null, digits: 2 },
  { key: "minSafetyFactor", label: "Safety factor", quantity: null, digits: 2 },
  { key: "rollbackDistance", label: "Rollback", quantity: "smallLength", digits: 1 },
  { key: "ardCatches", label: "ARD catches", quantity: null, digits: 0 },
  { key: "pickupDelay", label: "Pick-up delay (s)", quantity: null, digits: 2 },
  { key: "takeUpMaxRise", label: "Take-up rise", quantity: "smallLength", digits: 0 },
];

/** Figures a dispatch study plots against the interval: the chain's tension and the take-up's travel. */
export const DISPATCH_FIGURES: typeof FIGURES = [
  { key: "peakDriveTension", label: "Peak drive tension", quantity: "force", digits: 1 },
  { key: "peakTension", label: "Peak tension", quantity: "force", digits: 1 },
  { key: "takeUpMaxDrop", label: "Take-up drop", quantity: "smallLength", digits: 0 },
  { key: "takeUpMaxRise", label: "Take-up rise", quantity: "smallLength", digits: 0 },
];

export function figure(v: number | null | undefined, quantity: Quantity | null, units: UnitSystem, digits: number): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return "—";
  return quantity ? toDisplay(v, quantity, units).toFixed(digits) : v.toFixed(digits);
}

export function unitLabel(quantity: Quantity | null, units: UnitSystem): string {
  return quantity ? ` (${unitOf(quantity, units).label})` : "";
}

export function paramValue(key: string, v: number | string | undefined, units: UnitSystem, chains: Map<number, string>): string {
  if (v === undefined) return "—";
  if (key === "chainSpec") return chains.get(Number(v)) ?? String(v);
  if (key === "loading") return String(v);
  const q = PARAMETER_LABELS[key as StudyParameterKey]?.quantity;
  return q && typeof v === "number" ? toDisplay(v, q, units).toFixed(q === "mass" ? 0 : 2) : String(v);
}

export function paramHeader(key: string, units: UnitSystem): string {
  const meta = PARAMETER_LABELS[key as StudyParameterKey];
  return `${meta?.label ?? key}${unitLabel(meta?.quantity ?? null, units)}`;
}
