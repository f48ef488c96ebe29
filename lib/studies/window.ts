/**
 * The recommended operating window of a study: along its numeric parameter, the contiguous runs of
 * grid values where every case is acceptable, for each value of the other parameter. Stated in words
 * ("entry speed 2.6–3.1 m/s with the full train") and numbers. Pure: screens, the PDF and exports use it.
 */
import { display, type UnitSystem } from "@/lib/units/display";
import { NUMERIC_PARAMETERS, PARAMETER_LABELS, parameterValues, type StudyParameter, type StudyParameterKey } from "./schema";

export interface WindowCase {
  values: Record<string, number | string>;
  status: string;
  acceptable: boolean | null;
  /** False when the case's verdict differs on a coarser mesh (lib/studies/headline.ts); null/absent = not measured. */
  meshSettled?: boolean | null;
}

export interface WindowGroup {
  /** The other parameter's value for this group (null in a one-parameter study). */
  group: { key: StudyParameterKey; value: number | string } | null;
  /** Acceptable intervals [low, high] of the axis parameter, SI, inclusive grid values. */
  intervals: [number, number][];
}

export interface OperatingWindow {
  /** The numeric parameter the window runs along (null when both parameters are lists of names). */
  axis: StudyParameterKey | null;
  groups: WindowGroup[];
  /** Acceptable combinations when there is no numeric axis. */
  combos: Record<string, number | string>[];
  /** Cases not finished yet or failed: the window may still change. */
  incomplete: boolean;
  /** Finished cases whose verdict is not settled on the mesh (their values), so the window's edges there may move. */
  unsettled: Record<string, number | string>[];
  text: string;
}

const isNumeric = (k: StudyParameterKey) => (NUMERIC_PARAMETERS as readonly string[]).includes(k);

/** Names of categorical values for the sentence; chain ids are looked up by the caller. */
export type ValueNamer = (key: StudyParameterKey, value: number | string) => string;

export const defaultNamer: ValueNamer = (key, value) => {
  if (key === "loading") return value === "full" ? "the full train" : value === "empty" ? "the empty train" : "the part-loaded train";
  if (key === "chainSpec") return `chain ${value}`;
  return String(value);
};

function fmtValue(key: StudyParameterKey, si: number, units: UnitSystem): { text: string; unit: string } {
  const q = PARAMETER_LABELS[key].quantity;
  if (!q) return { text: String(si), unit: "" };
  const d = display(si, q, units);
  const digits = q === "mass" ? 0 : 2;
  return { text: d.value.toFixed(digits), unit: d.unit };
}

export function describeInterval(key: StudyParameterKey, [lo, hi]: [number, number], units: UnitSystem): string {
  const a = fmtValue(key, lo, units);
  const b = fmtValue(key, hi, units);
  return lo === hi ? `${a.text} ${a.unit}` : `${a.text}–${b.text} ${b.unit}`;
}

export function operatingWindow(
  parameters: StudyParameter[],
  cases: WindowCase[],
  opts: { units?: UnitSystem; name?: ValueNamer } = {},
): OperatingWindow {
  const units = opts.units ?? "si";
  const name = opts.name ?? defaultNamer;
  const incomplete = cases.some((c) => c.status !== "done");
  const unsettled = cases.filter((c) => c.status === "done" && c.meshSettled === false).map((c) => c.values);
  const describe = (v: Record<string, number | string>) =>
    parameters
      .map((p) => (isNumeric(p.key) ? `${PARAMETER_LABELS[p.key].label.toLowerCase()} ${describeInterval(p.key, [Number(v[p.key]), Number(v[p.key])], units)}` : name(p.key, v[p.key])))
      .join(" with ");
  const meshNote = unsettled.length
    ? ` Not settled on the mesh (the verdict differs at a coarser mesh or lies within its error of a limit): ${unsettled.map(describe).join("; ")}. Refine the mesh before relying on the window there.`
    : "";
  const axisParam = parameters.find((p) => isNumeric(p.key)) ?? null;
  const other = parameters.find((p) => p !== axisParam) ?? null;

  if (!axisParam) {
    const combos = cases.filter((c) => c.status === "done" && c.acceptable).map((c) => c.values);
    const text = combos.length
      ? `Acceptable: ${combos.map((v) => parameters.map((p) => name(p.key, v[p.key])).join(" with ")).join("; ")}.`
      : "No case of this study is acceptable.";
    return { axis: null, groups: [], combos, incomplete, unsettled, text: text + meshNote };
  }

  const axis = axisParam.key;
  const axisValues = (parameterValues(axisParam) as number[]).slice().sort((a, b) => a - b);
  const groupValues = other ? parameterValues(other) : [null];
  const groups: WindowGroup[] = [];
  for (const gv of groupValues) {
    const ok = new Map<number, boolean>();
    for (const c of cases) {
      if (other && c.values[other.key] !== gv) continue;
      ok.set(Number(c.values[axis]), c.status === "done" && c.acceptable === true);
    }
    const intervals: [number, number][] = [];
    let start: number | null = null;
    let prev: number | null = null;
    for (const v of axisValues) {
      if (ok.get(v)) {
        if (start === null) start = v;
        prev = v;
      } else if (start !== null) {
        intervals.push([start, prev!]);
        start = null;
      }
    }
    if (start !== null) intervals.push([start, prev!]);
    groups.push({ group: other && gv !== null ? { key: other.key, value: gv } : null, intervals });
  }

  const label = PARAMETER_LABELS[axis].label.toLowerCase();
  const parts = groups.map((g) => {
    const where = g.group ? ` with ${name(g.group.key, g.group.value)}` : "";
    if (!g.intervals.length) return `no acceptable ${label}${where}`;
    return `${label} ${g.intervals.map((iv) => describeInterval(axis, iv, units)).join(" and ")}${where}`;
  });
  let text = parts.join("; ");
  text = text.charAt(0).toUpperCase() + text.slice(1) + ".";
  if (incomplete) text += " (Not every case has finished: the window may still change.)";
  text += meshNote;
  return { axis, groups, combos: [], incomplete, unsettled, text };
}
