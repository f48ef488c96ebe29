/**
 * What a logger's header says: the unit written in a column name (`Time [ms]`, `Tension (kN)`,
 * `speed km/h`, `takeup_mm`), the column each channel probably is, and the units a file's mapped columns
 * resolve to: the unit the user chose, else the header's, else the SI unit, named as assumed. Pure, so the
 * wizard shows what the server will read.
 */
import { CHANNELS, FACTORS, type Channel, type Units } from "./schema";

export type ChannelKey = Channel | "time";
export type Quantity = "time" | "length" | "force" | "speed" | "current";

export const QUANTITY_OF: Record<ChannelKey, Quantity> = {
  time: "time",
  takeUpPosition: "length",
  trainPosition: "length",
  chainTension: "force",
  trainSpeed: "speed",
  driveCurrent: "current",
};

/** Units a logger column may be in, per quantity; the first is the SI one assumed when nothing is said. */
export const UNIT_CHOICES = {
  time: Object.keys(FACTORS.time),
  length: Object.keys(FACTORS.length),
  force: Object.keys(FACTORS.force),
  speed: Object.keys(FACTORS.speed),
  current: ["A"],
} as Record<Quantity, string[]>;

// Spellings seen in logger headers → the unit's name in FACTORS (lower-cased before the lookup).
const SPELLINGS: Record<string, { quantity: Quantity; unit: string }> = {};
const spell = (quantity: Quantity, unit: string, ...names: string[]) => names.forEach((n) => (SPELLINGS[n] = { quantity, unit }));
spell("time", "s", "s", "sec", "secs", "second", "seconds");
spell("time", "ms", "ms", "msec", "millis", "millisecond", "milliseconds");
spell("length", "m", "m", "metre", "metres", "meter", "meters");
spell("length", "cm", "cm");
spell("length", "mm", "mm");
spell("length", "in", "in", "inch", "inches", '"');
spell("length", "ft", "ft", "feet", "foot", "'");
spell("force", "N", "n", "newton", "newtons");
spell("force", "kN", "kn");
spell("force", "lbf", "lbf", "lb", "lbs");
spell("force", "kip", "kip", "kips", "klbf");
spell("speed", "m/s", "m/s", "mps", "m s-1", "m·s-1", "ms-1");
spell("speed", "km/h", "km/h", "kmh", "kph", "kmph");
spell("speed", "ft/s", "ft/s", "fps", "ftps");
spell("speed", "mph", "mph", "mi/h");
spell("current", "A", "a", "amp", "amps", "ampere", "amperes");

export interface HeaderUnit {
  /** The unit as written in the header. */
  written: string;
  /** Recognised unit and its quantity (null: written but not a unit Tautline reads). */
  known: { quantity: Quantity; unit: string } | null;
}

/**
 * The unit a column name states: the last `[…]` or `(…)` group, else a trailing word after a space or an
 * underscore when it is a known unit (`takeup_mm`, `speed km/h`). Null when the name states none.
 */
export function headerUnit(header: string): HeaderUnit | null {
  const bracket = [...header.matchAll(/[[(]\s*([^[\]()]+?)\s*[\])]/g)].pop();
  if (bracket) return { written: bracket[1], known: SPELLINGS[bracket[1].toLowerCase()] ?? null };
  const tail = header.trim().split(/[\s_]+/).pop() ?? "";
  if (tail === header.trim()) return null;
  const known = SPELLINGS[tail.toLowerCase()];
  return known ? { written: tail, known } : null;
}

const GUESS: Record<ChannelKey, RegExp> = {
  time: /^(t|time|zeit|sec|s|time_s|ms)\b/i,
  takeUpPosition: /take.?up|counterweight|\btu\b/i,
  chainTension: /tension|load|force/i,
  driveCurrent: /current|amp/i,
  trainPosition: /position|pos|distance/i,
  trainSpeed: /speed|velocity|vel/i,
};

/** A first guess at which column is which, by name; the user corrects it in the mapping step. */
export function suggestMapping(headers: string[]): Partial<Record<ChannelKey, string>> {
  const m: Partial<Record<ChannelKey, string>> = {};
  for (const k of ["time", ...CHANNELS] as ChannelKey[]) {
    const hit = headers.find((x) => GUESS[k].test(x) && !Object.values(m).includes(x));
    if (hit) m[k] = hit;
  }
  return m;
}

export interface ResolvedUnit {
  unit: string;
  /** Where the unit came from: chosen by the user, written in the header, or assumed (nothing said). */
  from: "chosen" | "header" | "assumed";
}

export interface UnitIssue {
  path: string;
  message: string;
}

const QUANTITY_UNITS_KEY: Partial<Record<Quantity, keyof Units>> = { time: "time", length: "length", force: "force", speed: "speed" };

/**
 * The unit each mapped column is read in: the unit chosen for that column in the mapping step (the step
 * shows the header's unit first, so a different choice is a correction); else the unit written in the
 * header; else the file-wide unit given for the quantity (`units.length` …); else SI, marked assumed.
 * A header unit of another quantity, or one Tautline does not read, is an issue unless a unit was chosen.
 */
export function resolveUnits(
  mapping: Partial<Record<ChannelKey, string>>,
  units: Partial<Units>,
  columnUnits: Partial<Record<ChannelKey, string>> = {},
): { columns: Partial<Record<ChannelKey, ResolvedUnit>>; issues: UnitIssue[] } {
  const columns: Partial<Record<ChannelKey, ResolvedUnit>> = {};
  const issues: UnitIssue[] = [];
  for (const key of ["time", ...CHANNELS] as ChannelKey[]) {
    const column = mapping[key];
    if (!column) continue;
    const q = QUANTITY_OF[key];
    const chosen = columnUnits[key];
    if (chosen) {
      if (UNIT_CHOICES[q].includes(chosen)) columns[key] = { unit: chosen, from: "chosen" };
      else issues.push({ path: `columnUnits.${key}`, message: `"${chosen}" is not a ${q} unit: choose one of ${UNIT_CHOICES[q].join(", ")}` });
      continue;
    }
    const stated = headerUnit(column);
    if (stated && !stated.known) {
      issues.push({ path: `columnUnits.${key}`, message: `column "${column}" is in "${stated.written}", which is not a unit Tautline reads for ${q}: choose one of ${UNIT_CHOICES[q].join(", ")}` });
      continue;
    }
    if (stated?.known && stated.known.quantity !== q) {
      issues.push({ path: `mapping.${key}`, message: `column "${column}" is in ${stated.known.unit}, a ${stated.known.quantity}; this channel needs a ${q} unit (${UNIT_CHOICES[q].join(", ")})` });
      continue;
    }
    const unitsKey = QUANTITY_UNITS_KEY[q];
    const fileWide = unitsKey ? (units[unitsKey] as string | undefined) : undefined;
    columns[key] = stated?.known ? { unit: stated.known.unit, from: "header" } : fileWide ? { unit: fileWide, from: "chosen" } : { unit: UNIT_CHOICES[q][0], from: "assumed" };
  }
  return { columns, issues };
}

/** SI factor of a resolved unit. */
export function factorOf(q: Quantity, unit: string): number {
  if (q === "current") return 1;
  return (FACTORS[q] as Record<string, number>)[unit];
}
