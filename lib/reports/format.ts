/** Numbers as the report prints them, in the reader's unit system (SI inside, converted only here). */
import { reasonText, type ReasonKind, type ReasonPart } from "@/sim/checks";
import { display, type Quantity, type UnitSystem } from "@/lib/units/display";

export function fmtQ(si: number | null | undefined, quantity: Quantity, units: UnitSystem, digits = 2): string {
  if (si === null || si === undefined || !Number.isFinite(si)) return "—";
  const d = display(si, quantity, units);
  return `${d.value.toFixed(digits)} ${d.unit}`;
}

export function fmtN(v: number | null | undefined, digits = 2): string {
  return v === null || v === undefined || !Number.isFinite(v) ? "—" : v.toFixed(digits);
}

/** The margin of a check: how far the value is from its limit, as a share of the limit. */
export function checkMargin(check: { key: string; value: number | boolean | null; limit: number | boolean | null }): string {
  if (typeof check.value !== "number" || typeof check.limit !== "number" || check.limit === 0) return "—";
  // Safety factor must stay above its limit; the rest must stay below.
  const m = check.key === "safetyFactor" ? (check.value - check.limit) / check.limit : (check.limit - check.value) / check.limit;
  return `${(m * 100).toFixed(0)} %`;
}

/** Each quantity a check reason quotes, as the report prints it in US customary units (decimals per unit). */
const US_REASON: Record<ReasonKind, (si: number) => string> = {
  force: (v) => fmtQ(v, "force", "us", 2),
  smallLength: (v) => fmtQ(v, "smallLength", "us", 2),
  length: (v) => fmtQ(v, "length", "us", 2),
  power: (v) => fmtQ(v, "power", "us", 1),
  rate: (v) => `${fmtQ(v, "smallLength", "us", 3)}/s`,
  speed: (v) => fmtQ(v, "speed", "us", 2),
  // Energy in ft·lbf, as the screen shows it (lib/units/display.ts).
  energy: (v) => fmtQ(v, "energy", "us", 0),
};

/** A check's reason in the report's units: the engine's SI line, or its parts converted to US customary. */
export function reasonIn(check: { reason: string; parts?: readonly ReasonPart[] }, units: UnitSystem): string {
  if (units === "si" || !check.parts?.length) return check.reason;
  return reasonText(check.parts, (p) => US_REASON[p.kind](p.q));
}
