/**
 * The one table of display quantities: values are SI inside; the screen, the reports and the exports show
 * the reader's system (SI or US customary). Each quantity kind has one SI display unit and one US customary
 * unit; the exact factors come from the engine's constants (sim/units.ts). Pure TypeScript (no React, no
 * browser APIs), so server modules (reports, study exports) and components use the same table; components
 * import it through lib/client/units.ts.
 */
import { FOOT as FT, HORSEPOWER as HP, INCH, POUND_FORCE as LBF, POUND_MASS as LB } from "@/sim/units";
import { reasonText, type ReasonPart } from "@/sim/checks";
import { parseNumber } from "@/lib/units/parse-number";

/** The reader's system of units. */
export type UnitSystem = "si" | "us";

export type Quantity =
  | "length"
  | "smallLength"
  | "mass"
  | "force"
  | "speed"
  | "massPerLength"
  | "axialStiffness"
  | "stiffness"
  | "power"
  | "torque"
  | "area"
  | "damping"
  | "time"
  | "angle"
  | "accelG"
  | "ratio"
  | "percent"
  /** A fraction stored as such (0.015) and shown in per cent (1.5 %). */
  | "fraction"
  /** Energy: kJ, or ft·lbf in US customary. */
  | "energy"
  | "count"
  | "rate"
  | "tempDelta"
  | "perKelvin"
  | "frequency"
  | "linearDamping";

export interface DisplayUnit {
  /** Unit label shown beside a field. */
  label: string;
  /** Multiply an SI value by this to get the display value. */
  factor: number;
  /** Significant decimals for read-outs. */
  digits: number;
  /** Significant figures a converted value is shown to in a field (the SI value itself is kept exactly). */
  sig?: number;
}


const SI: Record<Quantity, DisplayUnit> = {
  length: { label: "m", factor: 1, digits: 2 },
  smallLength: { label: "mm", factor: 1000, digits: 1 },
  mass: { label: "kg", factor: 1, digits: 0 },
  force: { label: "kN", factor: 1e-3, digits: 1 },
  speed: { label: "m/s", factor: 1, digits: 2 },
  massPerLength: { label: "kg/m", factor: 1, digits: 2 },
  axialStiffness: { label: "MN", factor: 1e-6, digits: 2 },
  stiffness: { label: "kN/m", factor: 1e-3, digits: 0 },
  power: { label: "kW", factor: 1e-3, digits: 1 },
  torque: { label: "N·m", factor: 1, digits: 0 },
  area: { label: "m²", factor: 1, digits: 2 },
  damping: { label: "N·s", factor: 1, digits: 0 },
  time: { label: "s", factor: 1, digits: 2 },
  angle: { label: "°", factor: 1, digits: 1 },
  accelG: { label: "g", factor: 1, digits: 2 },
  ratio: { label: "", factor: 1, digits: 3 },
  percent: { label: "%", factor: 1, digits: 1 },
  /** A fraction stored as such (0.015) and shown in per cent (1.5 %). */
  fraction: { label: "%", factor: 100, digits: 2 },
  energy: { label: "kJ", factor: 1e-3, digits: 1 },
  count: { label: "", factor: 1, digits: 0 },
  rate: { label: "mm/s", factor: 1000, digits: 2 },
  tempDelta: { label: "K", factor: 1, digits: 0 },
  perKelvin: { label: "1/K", factor: 1, digits: 7 },
  frequency: { label: "Hz", factor: 1, digits: 2 },
  /** Force per unit speed (a dashpot), N·s/m. */
  linearDamping: { label: "N·s/m", factor: 1, digits: 0 },
};

const US: Record<Quantity, DisplayUnit> = {
  ...SI,
  length: { label: "ft", factor: 1 / FT, digits: 2, sig: 4 },
  smallLength: { label: "in", factor: 1 / INCH, digits: 2, sig: 4 },
  mass: { label: "lb", factor: 1 / LB, digits: 0, sig: 4 },
  force: { label: "kip", factor: 1 / (1000 * LBF), digits: 2, sig: 4 },
  speed: { label: "ft/s", factor: 1 / FT, digits: 2, sig: 3 },
  massPerLength: { label: "lb/ft", factor: FT / LB, digits: 2, sig: 4 },
  axialStiffness: { label: "kip", factor: 1 / (1000 * LBF), digits: 0, sig: 4 },
  stiffness: { label: "lbf/in", factor: INCH / LBF, digits: 0, sig: 4 },
  power: { label: "hp", factor: 1 / HP, digits: 1, sig: 4 },
  torque: { label: "lbf·ft", factor: 1 / (LBF * FT), digits: 0, sig: 4 },
  area: { label: "ft²", factor: 1 / (FT * FT), digits: 2, sig: 4 },
  damping: { label: "lbf·s", factor: 1 / LBF, digits: 0, sig: 4 },
  rate: { label: "in/s", factor: 1 / INCH, digits: 3, sig: 3 },
  tempDelta: { label: "°F", factor: 1.8, digits: 0, sig: 4 },
  perKelvin: { label: "1/°F", factor: 1 / 1.8, digits: 7, sig: 4 },
  linearDamping: { label: "lbf·s/in", factor: INCH / LBF, digits: 1, sig: 4 },
  // Energy in ft·lbf, as US mechanical practice states work and kinetic energy (kip·ft reads as a moment).
  energy: { label: "ft·lbf", factor: 1 / (LBF * FT), digits: 0, sig: 4 },
};

export function unitOf(q: Quantity, system: UnitSystem): DisplayUnit {
  return (system === "us" ? US : SI)[q];
}

/** An SI value in the display unit of a quantity for the chosen system, with the unit's label. */
export function display(si: number, q: Quantity, system: UnitSystem): { value: number; unit: string } {
  const u = unitOf(q, system);
  return { value: si * u.factor, unit: u.label };
}

/** SI → display value. */
export function toDisplay(si: number, q: Quantity, system: UnitSystem): number {
  return si * unitOf(q, system).factor;
}

/** Display value → SI. */
export function fromDisplay(shown: number, q: Quantity, system: UnitSystem): number {
  return shown / unitOf(q, system).factor;
}

/** A read-out with its unit, e.g. "161.3 kN" (null / non-finite → "—"). */
export function formatQuantity(si: number | null | undefined, q: Quantity, system: UnitSystem, digits?: number): string {
  if (si === null || si === undefined || !Number.isFinite(si)) return "—";
  const u = unitOf(q, system);
  const v = si * u.factor;
  const text = v.toLocaleString("en-GB", {
    minimumFractionDigits: digits ?? u.digits,
    maximumFractionDigits: digits ?? u.digits,
  });
  return u.label ? `${text} ${u.label}` : text;
}

/**
 * A number as shown in a field: a converted value to the quantity's significant figures (122 m → "400.3"
 * ft), a value in its own SI unit to 6 (what was typed comes back); no grouping.
 */
export function editText(si: number | null | undefined, q: Quantity, system: UnitSystem): string {
  if (si === null || si === undefined || !Number.isFinite(si)) return "";
  const u = unitOf(q, system);
  return String(Number((si * u.factor).toPrecision(u.sig ?? 6)));
}

/** Parses a typed number (`2,5` or `2.5`; ambiguous `1,234` and junk give undefined). */
export function parseTyped(text: string): number | undefined {
  const r = parseNumber(text);
  return r.ok ? r.value : undefined;
}

/**
 * A check's one-line reason in the user's units: SI as the engine wrote it; US customary from the SI
 * quantities in its parts (a check without parts, from an older reader, keeps its SI line).
 */
export function formatReason(check: { reason: string; parts?: readonly ReasonPart[] }, system: UnitSystem): string {
  if (system === "si" || !check.parts?.length) return check.reason;
  return reasonText(check.parts, (p) => formatQuantity(p.q, p.kind, system));
}

/** A schema bound in the reader's unit, to the quantity's significant figures ("0 m/s", "262.5 ft"). */
export function formatBound(si: number, q: Quantity | undefined, system: UnitSystem): string {
  if (!q) return String(si);
  const u = unitOf(q, system);
  const text = si === 0 ? "0" : String(Number((si * u.factor).toPrecision(u.sig ?? 6)));
  return u.label ? `${text} ${u.label}` : text;
}
