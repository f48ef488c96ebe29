/**
 * The engine's unit constants: exact SI values of the US customary units, and each unit's SI factor (SI inside
 * always). Which unit a quantity is shown in is the display layer's business (lib/units/display.ts).
 * Exact definitions: 1 ft = 0.3048 m, 1 lb = 0.45359237 kg (international yard and pound agreement,
 * 1959; NIST SP 811), standard gravity g_n = 9.80665 m/s², so 1 lbf = 0.45359237 × 9.80665 N
 * = 4.4482216152605 N; 1 hp (mechanical) = 550 ft·lbf/s.
 */
export const FOOT = 0.3048;
export const INCH = FOOT / 12;
export const MILE = 5280 * FOOT;
export const POUND_MASS = 0.45359237;
export const STANDARD_GRAVITY = 9.80665;
export const POUND_FORCE = POUND_MASS * STANDARD_GRAVITY;
export const HORSEPOWER = 550 * FOOT * POUND_FORCE;

export interface UnitDef {
  symbol: string;
  /** SI value of one of this unit. */
  factor: number;
}

export const UNITS = {
  m: { symbol: "m", factor: 1 },
  mm: { symbol: "mm", factor: 1e-3 },
  ft: { symbol: "ft", factor: FOOT },
  in: { symbol: "in", factor: INCH },
  kg: { symbol: "kg", factor: 1 },
  lb: { symbol: "lb", factor: POUND_MASS },
  N: { symbol: "N", factor: 1 },
  kN: { symbol: "kN", factor: 1e3 },
  lbf: { symbol: "lbf", factor: POUND_FORCE },
  kip: { symbol: "kip", factor: 1000 * POUND_FORCE },
  "m/s": { symbol: "m/s", factor: 1 },
  "ft/s": { symbol: "ft/s", factor: FOOT },
  mph: { symbol: "mph", factor: MILE / 3600 },
  W: { symbol: "W", factor: 1 },
  kW: { symbol: "kW", factor: 1e3 },
  hp: { symbol: "hp", factor: HORSEPOWER },
  "N/strain": { symbol: "N", factor: 1 }, // axial stiffness E·A: force per unit strain
  "lbf/strain": { symbol: "lbf", factor: POUND_FORCE },
  "kg/m": { symbol: "kg/m", factor: 1 },
  "lb/ft": { symbol: "lb/ft", factor: POUND_MASS / FOOT },
  "m/s²": { symbol: "m/s²", factor: 1 },
  g: { symbol: "g", factor: STANDARD_GRAVITY },
  "N·m": { symbol: "N·m", factor: 1 },
  "lbf·ft": { symbol: "lbf·ft", factor: POUND_FORCE * FOOT },
  s: { symbol: "s", factor: 1 },
} as const satisfies Record<string, UnitDef>;

export type UnitName = keyof typeof UNITS;

export function toUnit(si: number, unit: UnitName): number {
  return si / UNITS[unit].factor;
}

export function fromUnit(value: number, unit: UnitName): number {
  return value * UNITS[unit].factor;
}

export function convert(value: number, from: UnitName, to: UnitName): number {
  return (value * UNITS[from].factor) / UNITS[to].factor;
}
