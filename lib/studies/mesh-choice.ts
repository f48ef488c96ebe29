/**
 * The mesh a study runs its cases at. Before the grid, the study's probe cases (its first and last case: opposite
 * corners of the grid) run at the scenario's segments N and at 2N; when a figure the checks use differs by more
 * than the mesh tolerance between the two, the pair moves up (2N against 4N, …) until they agree or the cap is
 * reached. The cases then run at the finer mesh of the agreeing pair, so each case's own coarse comparison (at
 * half its segments, lib/runs/mesh-check.ts) is the pair that agreed here. `chooseMesh` is pure (the runs are
 * handed in); `probeStudyMesh` runs the engine (a worker thread calls it: no database).
 */
import { simulate } from "@/sim/simulate";
import { MESH_FIGURES, MESH_TOLERANCE } from "@/sim/confidence";
import type { Scenario as EngineScenario } from "@/sim/schema";
import type { Summary } from "@/sim/summary";

/** Most segments the mesh choice goes to (bounds its cost and every case's). */
export const STUDY_MESH_CAP = 240;

/** Figures the checks are judged by, with the absolute change below which a difference does not count. */
export const STUDY_MESH_FIGURES: readonly { key: keyof Summary; label: string; floor: number }[] = (
  [
    ["peakTension", "peak tension"],
    ["peakDriveTension", "peak drive tension"],
    ["snatchFactor", "snatch factor"],
    ["rollbackDistance", "rollback"],
    ["peakArdForce", "ARD force"],
    ["takeUpMaxDrop", "take-up drop"],
    ["takeUpMaxRise", "take-up rise"],
  ] as const
).map(([key, label]) => ({ key, label, floor: MESH_FIGURES.find((f) => f.key === key)?.floor ?? 0.002 }));

/** The check figures of one probe case at one mesh (null: the figure did not happen). */
export type CheckFigures = Partial<Record<keyof Summary, number | null>>;

export function checkFiguresOf(summary: Summary): CheckFigures {
  const out: CheckFigures = {};
  for (const { key } of STUDY_MESH_FIGURES) {
    const v = summary[key];
    out[key] = typeof v === "number" && Number.isFinite(v) ? v : null;
  }
  return out;
}

export interface FigureDifference {
  key: string;
  label: string;
  /** |fine − coarse| / |fine|; null when either is missing or the fine value is 0. */
  relativeChange: number | null;
  agree: boolean;
}

/** Absolute floors that replace STUDY_MESH_FIGURES' own for a study (see `takeUpFloors`). */
export type FigureFloors = Partial<Record<keyof Summary, number>>;

/**
 * The take-up's check compares its drop and rise with the room it has (sim/checks.ts), so a change smaller than the
 * tolerance times its travel cannot move that check by more than the tolerance: below it the meshes agree.
 */
export function takeUpFloors(travel: number, tolerance = MESH_TOLERANCE): FigureFloors {
  return { takeUpMaxDrop: tolerance * travel, takeUpMaxRise: tolerance * travel };
}

/** Compares the figures of each probe case between two meshes; the worst figure first. */
export function compareFigures(
  coarse: CheckFigures[],
  fine: CheckFigures[],
  tolerance = MESH_TOLERANCE,
  floors: FigureFloors = {},
): { agree: boolean; worst: FigureDifference | null } {
  let worst: FigureDifference | null = null;
  let agree = true;
  const rank = (d: FigureDifference) => (d.agree ? 0 : 1) * 1e9 + (d.relativeChange ?? (d.agree ? 0 : 1e6));
  fine.forEach((f, i) => {
    const c = coarse[i] ?? {};
    for (const { key, label, floor: own } of STUDY_MESH_FIGURES) {
      const floor = Math.max(own, floors[key] ?? 0);
      const a = c[key] ?? null;
      const b = f[key] ?? null;
      let d: FigureDifference;
      if (a === null || b === null) d = { key, label, relativeChange: null, agree: a === null && b === null };
      else {
        const diff = Math.abs(b - a);
        const rel = b !== 0 ? diff / Math.abs(b) : null;
        d = { key, label, relativeChange: rel, agree: diff <= floor || (rel !== null && rel <= tolerance) };
      }
      if (!d.agree) agree = false;
      if (!worst || rank(d) > rank(worst)) worst = d;
    }
  });
  return { agree, worst };
}

export interface MeshTrial {
  coarse: number;
  fine: number;
  agree: boolean;
  worst: FigureDifference | null;
}

export interface MeshChoice {
  /** Segments every case runs at. */
  segments: number;
  /** The scenario's own segments, where the choice started. */
  startSegments: number;
  /** True when two meshes agreed on every check figure within the tolerance. */
  settled: boolean;
  /** True when the cap was reached without the meshes agreeing. */
  capped: boolean;
  cap: number;
  tolerance: number;
  trials: MeshTrial[];
  /** The engine failed on a finer mesh (its message); the cases run at the last mesh that ran. */
  error: string | null;
  /** One line for the study page. */
  reason: string;
}

const pct = (x: number | null) => (x === null ? "—" : `${(x * 100).toFixed(1)} %`);

export function meshChoiceReason(c: Omit<MeshChoice, "reason">): string {
  const tol = `${(c.tolerance * 100).toFixed(0)} %`;
  const last = c.trials[c.trials.length - 1];
  if (c.settled && last) return `Cases run at ${c.segments} segments: ${last.coarse} and ${last.fine} agreed within ${tol} on the check figures.`;
  if (c.error) return `Cases run at ${c.segments} segments: the engine failed on a finer mesh (${c.error}), so the mesh is not confirmed; treat the verdicts with care.`;
  const worst = last?.worst;
  const why = worst && last ? ` (${worst.label} still changes ${pct(worst.relativeChange)} between ${last.coarse} and ${last.fine})` : "";
  return `Cases run at ${c.segments} segments, the cap of the mesh choice, without settling${why}: refine the mesh by hand before relying on the verdicts.`;
}

/**
 * Chooses the mesh from `start` segments: `runAt(n)` gives the probe cases' check figures at n segments (it may
 * throw: the engine failed). Pairs (N, 2N) move up until they agree or N reaches `cap` (the last pair's finer mesh
 * is the cap). A start at or above the cap is kept as it is, unprobed: it is already finer than the choice would go,
 * and each case still reports its own coarse comparison (lib/runs/mesh-check.ts).
 */
export function chooseMesh(
  start: number,
  runAt: (segments: number) => CheckFigures[],
  opts: { cap?: number; tolerance?: number; floors?: FigureFloors } = {},
): MeshChoice {
  const cap = opts.cap ?? STUDY_MESH_CAP;
  const tolerance = opts.tolerance ?? MESH_TOLERANCE;
  const trials: MeshTrial[] = [];
  const done = (segments: number, settled: boolean, error: string | null = null): MeshChoice => {
    const c = { segments, startSegments: start, settled, capped: !settled && !error, cap, tolerance, trials, error };
    return { ...c, reason: meshChoiceReason(c) };
  };
  if (start >= cap) {
    const c = { segments: start, startSegments: start, settled: false, capped: false, cap, tolerance, trials, error: null };
    return { ...c, reason: `Cases run at the scenario's ${start} segments, at or above the ${cap} the mesh choice goes to: each case reports its own coarse comparison.` };
  }
  let coarse = start;
  let fine = Math.min(2 * start, cap);
  let a: CheckFigures[];
  try {
    a = runAt(coarse);
  } catch (err) {
    return done(start, false, err instanceof Error ? err.message : String(err));
  }
  for (;;) {
    let b: CheckFigures[];
    try {
      b = runAt(fine);
    } catch (err) {
      return done(coarse, false, err instanceof Error ? err.message : String(err));
    }
    const cmp = compareFigures(a, b, tolerance, opts.floors);
    trials.push({ coarse, fine, agree: cmp.agree, worst: cmp.worst });
    if (cmp.agree) return done(fine, true);
    if (fine >= cap) return done(fine, false);
    coarse = fine;
    a = b;
    fine = Math.min(2 * fine, cap);
  }
}

/** The mesh choice on real engine runs of the probe scenarios (no series, no frames). */
export function probeStudyMesh(probes: EngineScenario[], opts: { cap?: number; tolerance?: number; budgetMs?: number } = {}): MeshChoice {
  const t0 = Date.now();
  const start = probes[0].run.segments;
  const floors = takeUpFloors(Math.min(...probes.map((p) => p.takeUp.travel)), opts.tolerance);
  return chooseMesh(
    start,
    (segments) =>
      probes.map((s) => {
        const left = opts.budgetMs !== undefined ? opts.budgetMs - (Date.now() - t0) : undefined;
        if (left !== undefined && left <= 0) throw new Error(`no time left in the budget for ${segments} segments`);
        return checkFiguresOf(simulate(s, { segments, series: false, frameBudget: 0, budget: left !== undefined ? { wallTimeMs: left } : undefined }).summary);
      }),
    { ...opts, floors },
  );
}

/** The choice when the probe could not run at all: the cases keep the scenario's mesh, and the page says why. */
export function unprobedMeshChoice(start: number, message: string): MeshChoice {
  const c = { segments: start, startSegments: start, settled: false, capped: false, cap: STUDY_MESH_CAP, tolerance: MESH_TOLERANCE, trials: [], error: message };
  return { ...c, reason: `Cases run at the scenario's ${start} segments: the mesh could not be checked (${message}).` };
}
