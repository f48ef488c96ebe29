/**
 * The figures a study keeps per case (from the run's summary), and whether the case is acceptable:
 * no check of the lift fails (evaluateChecks of the engine, with the study's ARD rule).
 */
import { evaluateChecks, type Check } from "@/sim/checks";
import { designStatics } from "@/sim/statics";
import type { Summary } from "@/sim/summary";
import type { Scenario as EngineScenario } from "@/sim/schema";

export const HEADLINE_KEYS = [
  "peakTension",
  "snatchFactor",
  "minSafetyFactor",
  "rollbackDistance",
  "ardCatches",
  "pickupDelay",
  "takeUpMaxDrop",
  "takeUpMaxRise",
  "peakDrivePower",
  "peakRiderAccel",
] as const;
export type HeadlineKey = (typeof HEADLINE_KEYS)[number];
export type Headline = Record<HeadlineKey, number | null>;

export function headlineOf(summary: Record<string, unknown>): Headline {
  const out = {} as Headline;
  for (const k of HEADLINE_KEYS) {
    const v = summary[k];
    out[k] = typeof v === "number" && Number.isFinite(v) ? v : typeof v === "boolean" ? Number(v) : null;
  }
  return out;
}

export interface CaseVerdict {
  checks: Check[];
  acceptable: boolean;
}

/** Checks of one finished case; `requireNoArdCatch` overrides the scenario's allowRollback limit. */
export function judgeCase(inputs: EngineScenario, summary: Record<string, unknown>, requireNoArdCatch: boolean): CaseVerdict {
  const limits = { ...inputs.limits, allowRollback: !requireNoArdCatch };
  const statics = designStatics(inputs, { limits });
  const checks = evaluateChecks(summary as unknown as Summary, statics, limits);
  return { checks, acceptable: checks.every((c) => c.state !== "fail") };
}
