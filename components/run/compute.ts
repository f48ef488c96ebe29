/** The run and its checks, as the worker computes them (pure; also used for server results). */
import { designStatics, evaluateChecks, simulate, type Check, type Scenario, type Summary } from "@/sim";
import type { RunData } from "./types";

/** Coarse preview settings: what-if answers within a few hundred milliseconds. */
export const PREVIEW = { segments: 16, frameBudget: 150, sampleInterval: 0.04 } as const;
export const FULL = { frameBudget: 600, sampleInterval: 0.01 } as const;

export function checksFor(scenario: Scenario, summary: Summary): Check[] {
  try {
    return evaluateChecks(summary, designStatics(scenario), scenario.limits);
  } catch {
    return [];
  }
}

export function runScenario(scenario: Scenario, coarse: boolean, onProgress?: (f: number) => void): Omit<RunData, "origin"> {
  const t0 = typeof performance !== "undefined" ? performance.now() : Date.now();
  const r = simulate(scenario, coarse ? { ...PREVIEW, onProgress } : { ...FULL, onProgress });
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

/** The scenario with the what-if values applied (SI). */
export function withWhatIf(s: Scenario, w: { entrySpeed: number; chainSpeed: number; takeUpMass: number }): Scenario {
  return {
    ...s,
    trains: s.trains.map((t) => ({ ...t, entrySpeed: w.entrySpeed })),
    drive: { ...s.drive, speed: w.chainSpeed },
    takeUp: { ...s.takeUp, mass: w.takeUpMass },
  };
}
