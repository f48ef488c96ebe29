/**
 * The operating window of a two-parameter study as a region of its grid: each case's state (pass /
 * caution / fail, or open while unfinished) with the checks that fail, the governing check and its
 * utilisation at each case (for contours), the recommended window as the largest connected safe region
 * (4-neighbour connected cases where no check fails) with its margin, and the holes in it explained.
 * Pure: the study screen draws it, tests read it.
 */
import { display, type UnitSystem } from "@/lib/units/display";
import { PARAMETER_LABELS, parameterValues, type StudyParameter, type StudyParameterKey } from "./schema";
import { defaultNamer, type ValueNamer } from "./window";

export type CellState = "pass" | "caution" | "fail" | "open";

interface CheckLike {
  key: string;
  label: string;
  state: string;
  value: unknown;
  limit: unknown;
}

export interface RegionCase {
  values: Record<string, number | string>;
  status: string;
  checks: unknown[] | null;
}

export interface RegionCell {
  x: number | string;
  y: number | string;
  state: CellState;
  /** Labels of the checks that fail here (empty unless `state` is fail). */
  failing: string[];
  cautions: string[];
  /** The governing check's utilisation here: 1 at its limit, above 1 past it (null: not computed). */
  utilisation: number | null;
}

export interface StudyRegion {
  xKey: StudyParameterKey;
  yKey: StudyParameterKey;
  xs: (number | string)[];
  ys: (number | string)[];
  /** cells[j][i]: y index j, x index i. */
  cells: RegionCell[][];
  /** The check whose utilisation the contours show: the one failing in most cases, else the closest to its limit. */
  governing: { key: string; label: string } | null;
  /** The largest connected safe region (null: no safe case). */
  window: {
    cells: [number, number][];
    xRange: [number | string, number | string];
    yRange: [number | string, number | string];
    /** Highest utilisation of the governing check inside the window; margin = 1 − this. */
    worstUtilisation: number | null;
    /** True when the window fills its bounding box of the grid. */
    rectangular: boolean;
  } | null;
  /** Cases inside the window's bounding box that are not in it, with what fails there. */
  holes: { x: number | string; y: number | string; why: string }[];
  /** Safe cases outside the window (not connected to it). */
  detached: number;
}

/** Checks whose value must stay above the limit (a minimum); every other numeric check is a maximum. */
const MINIMUM_CHECKS = new Set(["safetyFactor"]);

export function utilisationOf(c: CheckLike): number | null {
  if (typeof c.value !== "number" || typeof c.limit !== "number" || !Number.isFinite(c.value) || !Number.isFinite(c.limit) || c.limit <= 0) return null;
  if (MINIMUM_CHECKS.has(c.key)) return c.value > 0 ? c.limit / c.value : Number.POSITIVE_INFINITY;
  return c.value / c.limit;
}

const checksOf = (c: RegionCase | undefined): CheckLike[] => (c?.checks ?? []) as CheckLike[];

export function studyRegion(parameters: StudyParameter[], cases: RegionCase[]): StudyRegion | null {
  if (parameters.length !== 2) return null;
  const [px, py] = parameters;
  const sorted = (p: StudyParameter) => {
    const v = parameterValues(p);
    return PARAMETER_LABELS[p.key].quantity ? (v as number[]).slice().sort((a, b) => a - b) : v;
  };
  const xs = sorted(px);
  const ys = sorted(py);
  const byKey = new Map(cases.map((c) => [`${c.values[px.key]}|${c.values[py.key]}`, c]));
  const at = (i: number, j: number) => byKey.get(`${xs[i]}|${ys[j]}`);

  // Governing check: fails in most finished cases; ties (and no failures) go to the highest utilisation.
  const score = new Map<string, { label: string; fails: number; worst: number }>();
  for (const c of cases) {
    if (c.status !== "done") continue;
    for (const ch of checksOf(c)) {
      const s = score.get(ch.key) ?? { label: ch.label, fails: 0, worst: Number.NEGATIVE_INFINITY };
      if (ch.state === "fail") s.fails++;
      const u = utilisationOf(ch);
      if (u !== null && u > s.worst) s.worst = u;
      score.set(ch.key, s);
    }
  }
  const ranked = [...score.entries()].filter(([, s]) => Number.isFinite(s.worst)).sort((a, b) => b[1].fails - a[1].fails || b[1].worst - a[1].worst);
  const governing = ranked.length ? { key: ranked[0][0], label: ranked[0][1].label } : null;

  const cells: RegionCell[][] = ys.map((y, j) =>
    xs.map((x, i) => {
      const c = at(i, j);
      const checks = checksOf(c);
      const failing = checks.filter((ch) => ch.state === "fail").map((ch) => ch.label);
      const cautions = checks.filter((ch) => ch.state === "caution").map((ch) => ch.label);
      const state: CellState = !c || c.status !== "done" ? "open" : failing.length ? "fail" : cautions.length ? "caution" : "pass";
      const g = governing ? checks.find((ch) => ch.key === governing.key) : undefined;
      const u = g ? utilisationOf(g) : null;
      return { x, y, state, failing, cautions, utilisation: u !== null && Number.isFinite(u) ? u : null };
    }),
  );

  // Largest 4-connected component of safe cells (pass or caution).
  const safe = (i: number, j: number) => cells[j][i].state === "pass" || cells[j][i].state === "caution";
  const seen = ys.map(() => xs.map(() => false));
  let best: [number, number][] = [];
  let safeCount = 0;
  for (let j = 0; j < ys.length; j++)
    for (let i = 0; i < xs.length; i++) {
      if (!safe(i, j)) continue;
      safeCount++;
      if (seen[j][i]) continue;
      const comp: [number, number][] = [];
      const stack: [number, number][] = [[i, j]];
      seen[j][i] = true;
      while (stack.length) {
        const [a, b] = stack.pop()!;
        comp.push([a, b]);
        for (const [da, db] of [[1, 0], [-1, 0], [0, 1], [0, -1]]) {
          const na = a + da;
          const nb = b + db;
          if (na < 0 || nb < 0 || na >= xs.length || nb >= ys.length || seen[nb][na] || !safe(na, nb)) continue;
          seen[nb][na] = true;
          stack.push([na, nb]);
        }
      }
      if (comp.length > best.length) best = comp;
    }
  if (!best.length) return { xKey: px.key, yKey: py.key, xs, ys, cells, governing, window: null, holes: [], detached: 0 };

  const iMin = Math.min(...best.map(([i]) => i));
  const iMax = Math.max(...best.map(([i]) => i));
  const jMin = Math.min(...best.map(([, j]) => j));
  const jMax = Math.max(...best.map(([, j]) => j));
  const inWindow = new Set(best.map(([i, j]) => `${i},${j}`));
  const holes: StudyRegion["holes"] = [];
  for (let j = jMin; j <= jMax; j++)
    for (let i = iMin; i <= iMax; i++) {
      if (inWindow.has(`${i},${j}`)) continue;
      const c = cells[j][i];
      const why = c.state === "fail" ? `${c.failing.join(", ")} fails` : c.state === "open" ? "not finished" : "safe, but not connected to the window";
      holes.push({ x: c.x, y: c.y, why });
    }
  const us = best.map(([i, j]) => cells[j][i].utilisation).filter((u): u is number => u !== null);
  return {
    xKey: px.key,
    yKey: py.key,
    xs,
    ys,
    cells,
    governing,
    window: {
      cells: best,
      xRange: [xs[iMin], xs[iMax]],
      yRange: [ys[jMin], ys[jMax]],
      worstUtilisation: us.length ? Math.max(...us) : null,
      rectangular: best.length === (iMax - iMin + 1) * (jMax - jMin + 1),
    },
    holes,
    detached: safeCount - best.length,
  };
}

/** An axis's name with its unit in the reader's system, e.g. "Entry speed (ft/s)"; names only for lists. */
export function axisTitle(key: StudyParameterKey, units: UnitSystem): string {
  const meta = PARAMETER_LABELS[key];
  return meta.quantity ? `${meta.label} (${display(1, meta.quantity, units).unit})` : meta.label;
}

/** One grid value in the reader's units ("2.20 m/s", "4850 lb") or its name. */
export function axisValue(key: StudyParameterKey, v: number | string, units: UnitSystem, name: ValueNamer = defaultNamer): string {
  const q = PARAMETER_LABELS[key].quantity;
  if (!q || typeof v !== "number") return key === "loading" ? String(v) : name(key, v);
  const d = display(v, q, units);
  return `${d.value.toFixed(q === "mass" ? 0 : 2)} ${d.unit}`;
}

/** The recommended window in words: the region's extent, its size, its margin, and its holes. */
export function describeRegion(r: StudyRegion, units: UnitSystem, name: ValueNamer = defaultNamer): string {
  const label = (k: StudyParameterKey) => PARAMETER_LABELS[k].label.toLowerCase();
  const range = (k: StudyParameterKey, [a, b]: [number | string, number | string]) => (a === b ? axisValue(k, a, units, name) : `${axisValue(k, a, units, name)} to ${axisValue(k, b, units, name)}`);
  const total = r.xs.length * r.ys.length;
  if (!r.window) return `No case of this study is safe: every finished case fails a check${r.governing ? ` (most often ${r.governing.label})` : ""}.`;
  const w = r.window;
  const parts = [
    `Recommended window: ${label(r.xKey)} ${range(r.xKey, w.xRange)} with ${label(r.yKey)} ${range(r.yKey, w.yRange)}`,
    ` (the largest connected safe region, ${w.cells.length} of ${total} cases${w.rectangular ? "" : ", not a full rectangle"}).`,
  ];
  if (r.governing && w.worstUtilisation !== null) {
    const used = w.worstUtilisation * 100;
    parts.push(` Margin: the governing check, ${r.governing.label}, uses at most ${used.toFixed(0)} % of its limit inside the window (${(100 - used).toFixed(0)} % to spare).`);
  }
  if (r.holes.length) {
    const listed = r.holes.slice(0, 6).map((h) => `${axisValue(r.xKey, h.x, units, name)} with ${axisValue(r.yKey, h.y, units, name)}: ${h.why}`);
    parts.push(` Holes: ${listed.join("; ")}${r.holes.length > 6 ? `; and ${r.holes.length - 6} more` : ""}.`);
  }
  if (r.detached) parts.push(` ${r.detached} other safe case(s) lie apart from the window and are not recommended.`);
  return parts.join("");
}
