/**
 * The check limits as a report states them: a label in words and the value with its unit in the reader's
 * system. Limits this table does not know yet (the engine may add some) still read as words, from their
 * key, with the value as given.
 */
import type { UnitSystem } from "@/lib/units/display";
import { fmtQ } from "./format";

type Formatter = (v: number, units: UnitSystem) => string;

const factor: Formatter = (v) => `${Number(v.toPrecision(4))}`;
// Source: a temperature difference of 1 K is 1.8 °F (definition of the Fahrenheit scale).
const tempDiff: Formatter = (v, u) => (u === "si" ? `${Number(v.toPrecision(4))} K` : `${Number((v * 1.8).toPrecision(4))} °F`);
const perTemp: Formatter = (v, u) => (u === "si" ? `${(v * 1e6).toFixed(1)} × 10⁻⁶ per K` : `${((v / 1.8) * 1e6).toFixed(2)} × 10⁻⁶ per °F`);

const LIMIT_LABELS: Record<string, { label: string; format: Formatter }> = {
  requiredSafetyFactor: { label: "Required safety factor on breaking strength", format: factor },
  maxSnatchFactor: { label: "Highest allowed snatch factor (peak ÷ steady tension)", format: factor },
  motorRating: { label: "Motor rating", format: (v, u) => fmtQ(v, "power", u, 1) },
  maxRiderAccel: { label: "Rider acceleration that may be exceeded briefly", format: (v) => `${Number(v.toPrecision(4))} g` },
  riderAccelBriefDuration: { label: "Longest time above the brief rider acceleration", format: (v) => `${Number(v.toPrecision(4))} s` },
  riderAccelSustained: { label: "Rider acceleration that may be exceeded for a sustained time", format: (v) => `${Number(v.toPrecision(4))} g` },
  riderAccelSustainedDuration: { label: "Longest time above the sustained rider acceleration", format: (v) => `${Number(v.toPrecision(4))} s` },
  riderAccelCeiling: { label: "Rider acceleration never to be exceeded", format: (v) => `${Number(v.toPrecision(4))} g` },
  riderAccelBackwardScale: { label: "Scale of the envelope for slowing (rider pitched forward)", format: factor },
  maxTimeToChainSpeed: { label: "Longest allowed time to chain speed", format: (v) => `${Number(v.toPrecision(4))} s` },
  allowableWorkingLoad: { label: "Allowable working load of the chain (maker's data)", format: (v, u) => fmtQ(v, "force", u, 1) },
  workingLoadFraction: { label: "Working load as a fraction of breaking strength", format: (v) => `1/${Number((1 / v).toPrecision(3))}` },
  minBreakingRatio: { label: "Lowest breaking strength against ASME B29.1 (× 12,500·P² lbf)", format: factor },
  maxBreakingRatio: { label: "Highest breaking strength against ASME B29.1 (× 12,500·P² lbf)", format: factor },
  releaseEnergyMargin: { label: "Energy margin to clear the crest after release", format: factor },
  maxPickupDelay: { label: "Longest allowed load pick-up delay", format: (v) => `${Number(v.toPrecision(4))} s` },
  wearAllowance: { label: "Chain wear allowance (elongation)", format: (v) => `${Number(v.toPrecision(4))} %` },
  thermalDeltaT: { label: "Temperature swing from installation", format: tempDiff },
  thermalExpansion: { label: "Thermal expansion coefficient of the chain", format: perTemp },
  allowRollback: { label: "Settling back onto the anti-rollback device allowed", format: (v) => (v ? "yes" : "no") },
};

/** camelCase key → "Camel case" words, for limits without a label here. */
export function keyInWords(key: string): string {
  const words = key.replace(/([a-z0-9])([A-Z])/g, "$1 $2").replace(/[_.]+/g, " ").toLowerCase().trim();
  return words.charAt(0).toUpperCase() + words.slice(1);
}

export function limitLabel(key: string): string {
  return LIMIT_LABELS[key]?.label ?? keyInWords(key);
}

export function limitValue(key: string, v: unknown, units: UnitSystem): string {
  if (v === undefined || v === null) return "not given";
  if (typeof v === "boolean") return v ? "yes" : "no";
  if (typeof v === "number") return LIMIT_LABELS[key] ? LIMIT_LABELS[key].format(v, units) : String(Number(v.toPrecision(6)));
  return String(v);
}
