/**
 * Mesh confidence: compares a run's headline figures and check verdicts with a run of the same scenario on a
 * coarser mesh and says whether they are converged. The error of the finer figure is estimated by Richardson's
 * rule, |f_fine − f_coarse| / (r^p − 1) for a refinement ratio r and an observed order p (Roache, Verification
 * and Validation in Computational Science and Engineering), so a verdict whose value lies within that error of
 * its limit is flagged as not settled instead of flipping silently with the mesh. Pure.
 */
import type { Check, CheckState } from "./checks";
import type { Scenario } from "./schema";
import { simulate } from "./simulate";
import type { Summary } from "./summary";

/** Figures compared between meshes, with the absolute change below which a difference does not count. */
export const MESH_FIGURES: readonly { key: keyof Summary; floor: number }[] = [
  { key: "peakTension", floor: 100 }, // N
  { key: "peakDriveTension", floor: 100 },
  { key: "steadyTension", floor: 100 },
  { key: "snatchFactor", floor: 0.005 },
  { key: "peakDogForce", floor: 100 },
  { key: "peakArdForce", floor: 100 },
  { key: "rollbackDistance", floor: 0.002 }, // m
  { key: "takeUpMaxDrop", floor: 0.002 },
  { key: "takeUpCreepRate", floor: 0.0002 }, // m/s
  { key: "peakRiderAccel", floor: 0.01 }, // g
  { key: "timeToChainSpeed", floor: 0.02 }, // s
  { key: "pickupDelay", floor: 0.02 },
];

/** Largest relative change of a figure between meshes that counts as converged (an assumption). */
export const MESH_TOLERANCE = 0.02;

export interface MeshRun {
  segments: number;
  summary: Summary;
  checks: Check[];
}

export interface FigureConvergence {
  key: string;
  fine: number | null;
  coarse: number | null;
  /** |fine − coarse| / |fine| (null when either is missing or the fine value is 0). */
  relativeChange: number | null;
  /** Richardson estimate of the fine figure's discretisation error (same unit as the figure). */
  estimatedError: number | null;
  converged: boolean;
}

export interface VerdictChange {
  key: string;
  label: string;
  fine: CheckState;
  coarse: CheckState;
}

export interface MeshConfidence {
  fineSegments: number;
  coarseSegments: number;
  /** Every figure within tolerance and no verdict changed or within the error of its limit. */
  converged: boolean;
  figures: FigureConvergence[];
  /** Checks whose state differs between the meshes. */
  flipped: VerdictChange[];
  /** Checks whose value lies within the estimated error of their limit (the verdict may still change). */
  marginal: string[];
  tolerance: number;
  /** One line for a reader. */
  message: string;
}

export interface MeshConfidenceOptions {
  /** Largest relative change of a figure that counts as converged (default 0.02, an assumption). */
  tolerance?: number;
  /** Observed order of convergence p for the error estimate (default 1, the conservative choice). */
  order?: number;
}

/** The coarser mesh compared against: half the segments, at least 4. */
export function coarserSegments(segments: number): number {
  return Math.max(4, Math.round(segments / 2));
}

const num = (v: unknown): number | null => (typeof v === "number" && Number.isFinite(v) ? v : null);

export function meshConfidence(fine: MeshRun, coarse: MeshRun, opts: MeshConfidenceOptions = {}): MeshConfidence {
  const tolerance = opts.tolerance ?? MESH_TOLERANCE;
  const p = opts.order ?? 1;
  const r = fine.segments / Math.max(1, coarse.segments);
  const factor = r > 1 ? Math.pow(r, p) - 1 : 1;
  const figures: FigureConvergence[] = MESH_FIGURES.map(({ key, floor }) => {
    const f = num(fine.summary[key]);
    const c = num(coarse.summary[key]);
    if (f === null || c === null)
      return { key, fine: f, coarse: c, relativeChange: null, estimatedError: null, converged: f === null && c === null };
    const diff = Math.abs(f - c);
    const rel = f !== 0 ? diff / Math.abs(f) : null;
    return { key, fine: f, coarse: c, relativeChange: rel, estimatedError: diff / factor, converged: diff <= floor || (rel !== null && rel <= tolerance) };
  });
  const coarseByKey = new Map(coarse.checks.map((c) => [c.key, c]));
  const flipped: VerdictChange[] = [];
  for (const c of fine.checks) {
    const o = coarseByKey.get(c.key);
    if (o && o.state !== c.state) flipped.push({ key: c.key, label: c.label, fine: c.state, coarse: o.state });
  }
  // A numeric verdict is marginal when the mesh could move its value across the limit.
  const marginal: string[] = [];
  for (const c of fine.checks) {
    const o = coarseByKey.get(c.key);
    const v = num(c.value);
    const ov = num(o?.value);
    const lim = num(c.limit);
    if (v === null || ov === null || lim === null) continue;
    const err = Math.abs(v - ov) / factor;
    if (err > 0 && Math.abs(v - lim) <= err) marginal.push(c.key);
  }
  const loose = figures.filter((f) => !f.converged);
  const converged = loose.length === 0 && flipped.length === 0 && marginal.length === 0;
  const pct = (x: number | null) => (x === null ? "—" : `${(x * 100).toFixed(1)} %`);
  const parts: string[] = [];
  if (loose.length) parts.push(`${loose.map((f) => `${f.key} changes ${pct(f.relativeChange)}`).join(", ")}`);
  if (flipped.length) parts.push(flipped.map((f) => `${f.label}: ${f.fine} at ${fine.segments}, ${f.coarse} at ${coarse.segments} segments`).join("; "));
  if (marginal.length) parts.push(`within the mesh error of its limit: ${marginal.join(", ")}`);
  const message = converged
    ? `Converged: headline figures within ${pct(tolerance)} between ${coarse.segments} and ${fine.segments} segments, verdicts unchanged.`
    : `Not converged between ${coarse.segments} and ${fine.segments} segments (${parts.join("; ")}): refine the mesh before relying on these verdicts.`;
  return { fineSegments: fine.segments, coarseSegments: coarse.segments, converged, figures, flipped, marginal, tolerance, message };
}

/**
 * Runs the scenario again at coarserSegments(N) (no series, no frames: about half the cost of the run itself)
 * and compares. `checksOf` evaluates the checks of a summary the way the caller does for the fine run.
 */
export function runMeshConfidence(
  scenario: Scenario,
  fine: { summary: Summary; checks: Check[] },
  checksOf: (summary: Summary) => Check[],
  opts: MeshConfidenceOptions = {},
): MeshConfidence {
  const coarse = simulate(scenario, { segments: coarserSegments(fine.summary.segments), series: false, frameBudget: 0 });
  return meshConfidence(
    { segments: fine.summary.segments, summary: fine.summary, checks: fine.checks },
    { segments: coarse.summary.segments, summary: coarse.summary, checks: checksOf(coarse.summary) },
    opts,
  );
}
