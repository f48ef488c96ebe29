/** The run and its checks, as the worker computes them (pure; also used for server results). */
import { designStatics, evaluateChecks, simulate, type Check, type DesignStatics, type Scenario, type Series, type Summary } from "@/sim";
import { SERIES_KEYS, TRAIN_SERIES_KEYS, type TrainSeries } from "@/sim/frames";
import type { RunData } from "./types";

/**
 * Coarse preview settings: what-if answers while the slider moves (target: slider to redrawn plots within
 * 50 ms median). A coarse chain mesh, few replay frames, a series every 0.05 s (800 samples over 40 s, still
 * finer than the plots' pixels), and the time step at 0.9 of the stability limit (PREVIEW_STEP_FRACTION).
 * tests/unit/preview-vs-full.test.ts holds the preview's headline figures against the full run's.
 */
export const PREVIEW = { segments: 12, frameBudget: 60, sampleInterval: 0.05 } as const;
/**
 * The preview's step as a fraction of the stability limit; the engine bench (sim/bench.ts) finds peak
 * tension within 0.5 % of the finer step up to 0.95 on coarse meshes, so 0.9 keeps a margin (assumption).
 */
export const PREVIEW_STEP_FRACTION = 0.9;
export const FULL = { frameBudget: 600, sampleInterval: 0.01 } as const;

/**
 * The design statics (steady running) of the last scenario asked for. They do not depend on the trains'
 * entry speed (tests/unit/preview-vs-full.test.ts holds that), so an entry-speed slider reuses them.
 */
let staticsCache: { key: string; statics: DesignStatics } | null = null;
export function staticsFor(scenario: Scenario): DesignStatics {
  const key = JSON.stringify({ ...scenario, trains: scenario.trains.map((t) => ({ ...t, entrySpeed: 0 })) });
  if (staticsCache?.key !== key) staticsCache = { key, statics: designStatics(scenario) };
  return staticsCache.statics;
}

export function checksFor(scenario: Scenario, summary: Summary): Check[] {
  try {
    return evaluateChecks(summary, staticsFor(scenario), scenario.limits);
  } catch {
    return [];
  }
}

/** The scenario as the preview runs it: never a finer step than the scenario's own. */
export function previewScenario(scenario: Scenario): Scenario {
  return scenario.run.stepFraction >= PREVIEW_STEP_FRACTION ? scenario : { ...scenario, run: { ...scenario.run, stepFraction: PREVIEW_STEP_FRACTION } };
}

export function runScenario(scenario: Scenario, coarse: boolean, onProgress?: (f: number) => void): Omit<RunData, "origin"> {
  const t0 = typeof performance !== "undefined" ? performance.now() : Date.now();
  const r = simulate(coarse ? previewScenario(scenario) : scenario, coarse ? { ...PREVIEW, onProgress } : { ...FULL, onProgress });
  const wallTimeMs = (typeof performance !== "undefined" ? performance.now() : Date.now()) - t0;
  return {
    scenario,
    summary: r.summary,
    series: r.series,
    frames: r.frames,
    layout: r.layout,
    notes: r.notes,
    checks: checksFor(scenario, r.summary),
    wallTimeMs,
  };
}

/** A run's series as one Float64Array (columns t, the flat keys, then each train's keys), for transfer. */
export interface PackedSeries {
  samples: number;
  trains: number;
  values: Float64Array;
}

export function packSeries(series: Series): PackedSeries {
  const n = series.t.length;
  const trains = series.trains?.length ?? 0;
  const cols: readonly number[][] = [series.t, ...SERIES_KEYS.map((k) => series[k] ?? []), ...series.trains.flatMap((tr) => TRAIN_SERIES_KEYS.map((k) => tr[k]))];
  const values = new Float64Array(cols.length * n);
  cols.forEach((c, i) => {
    const o = i * n;
    for (let j = 0; j < n; j++) values[o + j] = c[j] ?? NaN;
  });
  return { samples: n, trains, values };
}

export function unpackSeries(p: PackedSeries): Series {
  const n = p.samples;
  let col = 0;
  const next = () => {
    const o = n * col++;
    return Array.from(p.values.subarray(o, o + n));
  };
  const s = { t: next() } as Series;
  for (const k of SERIES_KEYS) s[k] = next();
  s.trains = [];
  for (let j = 0; j < p.trains; j++) {
    const tr = {} as TrainSeries;
    for (const k of TRAIN_SERIES_KEYS) tr[k] = next();
    s.trains.push(tr);
  }
  return s;
}

/** The scenario with the what-if values applied (SI). */
export function withWhatIf(s: Scenario, w: { entrySpeed: number; chainSpeed: number; takeUpMass: number }): Scenario {
  return {
    ...s,
    trains: s.trains.map((t) => ({ ...t, entrySpeed: w.entrySpeed })),
    drive: { ...s.drive, speed: w.chainSpeed },
    takeUp: { ...s.takeUp, mass: w.takeUpMass },
  };
}
