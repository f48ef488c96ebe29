/**
 * Calibration: fits the chain's axial stiffness E·A and internal damping (and optionally the guide
 * friction coefficient) so the engine's take-up trace matches a recorded one, by least squares over the
 * recorded samples (Nelder–Mead on log E·A and log damping). The recording is aligned to the run at
 * engagement (recorded engagement time ↔ the run's first dog contact). Pure: engine + numbers only (no
 * database), so it runs in the job pool's worker thread (lib/engine/worker.ts) or in a test. Kept cheap: a coarse mesh and a short window around the pick-up.
 */
import { designStatics, parseScenario, simulate, type Scenario } from "@/sim";
import { nelderMead } from "./nelder-mead";
import { fitQuality, interpolate, type FitQuality } from "./trace";

export interface RecordedTrace {
  /** Recording time, s (increasing). */
  t: number[];
  /** Take-up drop from its first sample, m, positive down (the engine's convention). */
  takeUp: number[];
  /** Engagement (dog picks up the train) in recording time, s. */
  engagementTime: number;
}

export interface CalibrationOptions {
  fitFriction?: boolean;
  /** Coarse mesh for the fit (default 12 segments). */
  segments?: number;
  /** Simulated seconds per evaluation (default: the recording's span, at most 12 s). */
  duration?: number;
  /** Function evaluations (default 60). */
  maxEvaluations?: number;
  /** Series grid of each evaluation, s (default 0.02). */
  sampleInterval?: number;
  /** Called after every engine run with the share of the evaluation budget used (0–1). */
  onProgress?: (fraction: number) => void;
}

export interface CalibrationParams {
  axialStiffness: number;
  damping: number;
  guideFriction: number;
}

export interface HeadlineFigures {
  peakTension: number;
  /** Null when the run has no steady climb to compare with. */
  snatchFactor: number | null;
  takeUpMaxRise: number;
  takeUpMaxDrop: number;
  minSafetyFactor: number;
  takeUpMargin: number;
}

export interface CalibrationResult {
  initial: CalibrationParams;
  fitted: CalibrationParams;
  quality: { initial: FitQuality; fitted: FitQuality };
  /** Headline figures of the coarse run with the initial and the fitted values. */
  headline: { initial: HeadlineFigures; fitted: HeadlineFigures };
  evaluations: number;
  converged: boolean;
  /** The fitted trace on the recording's time grid, for the overlay. */
  fittedTrace: { t: number[]; takeUp: number[] };
  settings: { segments: number; duration: number; sampleInterval: number };
}

const DEFAULT_DAMPING = 2000;

function withParams(base: Scenario, p: CalibrationParams, segments: number, duration: number): Scenario {
  const s = structuredClone(base) as Scenario;
  s.chain.axialStiffness = p.axialStiffness;
  s.chain.damping = p.damping;
  s.chain.guideFriction = p.guideFriction;
  s.run = { ...s.run, segments, duration, integrator: "verlet" };
  return s;
}

interface Evaluated {
  sq: number;
  model: number[];
  measured: number[];
  times: number[];
  headline: HeadlineFigures;
}

type EvalSettings = Required<Omit<CalibrationOptions, "fitFriction" | "onProgress">>;

function evaluate(base: Scenario, rec: RecordedTrace, p: CalibrationParams, o: EvalSettings): Evaluated | null {
  const parsed = parseScenario(withParams(base, p, o.segments, o.duration));
  if (!parsed.ok) return null;
  let r;
  try {
    r = simulate(parsed.scenario, { frameBudget: 0, sampleInterval: o.sampleInterval, budget: { wallTimeMs: 20_000 } });
  } catch {
    return null;
  }
  const eng = r.summary.engagementTime;
  if (eng === null) return null;
  const shift = eng - rec.engagementTime;
  const model: number[] = [];
  const measured: number[] = [];
  const times: number[] = [];
  let sq = 0;
  for (let i = 0; i < rec.t.length; i++) {
    const y = interpolate(r.series.t, r.series.takeUpPosition, rec.t[i] + shift);
    if (Number.isNaN(y)) continue;
    model.push(y);
    measured.push(rec.takeUp[i]);
    times.push(rec.t[i]);
    sq += (y - rec.takeUp[i]) ** 2;
  }
  if (model.length < 10) return null;
  const st = designStatics(parsed.scenario);
  return {
    sq: sq / model.length,
    model,
    measured,
    times,
    headline: {
      peakTension: r.summary.peakTension,
      snatchFactor: r.summary.snatchFactor ?? null,
      takeUpMaxRise: r.summary.takeUpMaxRise,
      takeUpMaxDrop: r.summary.takeUpMaxDrop,
      minSafetyFactor: r.summary.minSafetyFactor,
      takeUpMargin: st.takeUp.margin,
    },
  };
}

export function calibrate(base: Scenario, rec: RecordedTrace, opts: CalibrationOptions = {}): CalibrationResult {
  const span = rec.t.length ? rec.t[rec.t.length - 1] - rec.t[0] : 0;
  const o: EvalSettings = {
    segments: opts.segments ?? 12,
    duration: opts.duration ?? Math.min(12, Math.max(1, span + 0.5)),
    maxEvaluations: opts.maxEvaluations ?? 60,
    sampleInterval: opts.sampleInterval ?? 0.02,
  };
  const fitFriction = opts.fitFriction ?? false;
  const initial: CalibrationParams = {
    axialStiffness: base.chain.axialStiffness,
    damping: base.chain.damping ?? DEFAULT_DAMPING,
    guideFriction: base.chain.guideFriction ?? 0.02,
  };
  // Log coordinates: both quantities are positive and matter by ratio. A damping of 0 starts from the default.
  const d0 = initial.damping > 0 ? initial.damping : DEFAULT_DAMPING;
  const toParams = (x: number[]): CalibrationParams => ({
    axialStiffness: initial.axialStiffness * Math.exp(x[0]),
    damping: d0 * Math.exp(x[1]),
    guideFriction: fitFriction ? Math.min(0.5, Math.max(0, initial.guideFriction + x[2])) : initial.guideFriction,
  });
  // The budget plus the two closing runs (initial and fitted values): the share reported never passes 1.
  const total = o.maxEvaluations + 2;
  let runs = 0;
  const counted = (p: CalibrationParams) => {
    const e = evaluate(base, rec, p, o);
    runs++;
    opts.onProgress?.(Math.min(1, runs / total));
    return e;
  };
  const objective = (x: number[]) => counted(toParams(x))?.sq ?? Number.POSITIVE_INFINITY;
  const x0 = fitFriction ? [0, 0, 0] : [0, 0];
  const nm = nelderMead(objective, x0, {
    step: fitFriction ? [0.15, 0.5, 0.01] : [0.15, 0.5],
    maxEvaluations: o.maxEvaluations,
    xTolerance: 1e-3,
  });
  const fitted = toParams(nm.x);
  const a = counted(initial);
  const b = counted(fitted);
  if (!a || !b) throw new Error("The engine could not run this lift and train over the recording's span.");
  return {
    initial,
    fitted,
    quality: { initial: fitQuality(a.measured, a.model), fitted: fitQuality(b.measured, b.model) },
    headline: { initial: a.headline, fitted: b.headline },
    evaluations: nm.evaluations,
    converged: nm.converged,
    fittedTrace: { t: b.times, takeUp: b.model },
    settings: o,
  };
}
