/**
 * The figures a study keeps per case (from the run's summary), and whether the case is acceptable:
 * no check of the lift fails (evaluateChecks of the engine, with the study's ARD rule).
 */
import { evaluateChecks, type Check } from "@/sim/checks";
import { designStatics } from "@/sim/statics";
import type { Summary } from "@/sim/summary";
import type { Scenario as EngineScenario } from "@/sim/schema";
import { meshConfidence, type MeshConfidence } from "@/sim/confidence";
import { dispatchTimes } from "./dispatch";

/** Mesh confidence of a case, with whether its acceptability verdict is the same on the coarser mesh. */
export type CaseMeshConfidence = MeshConfidence & { verdictSettled: boolean; coarseAcceptable: boolean };

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
  "peakDriveTension",
  // Dispatch cases (two trains or more; null otherwise): lib/studies/dispatch.ts.
  "secondPickupTime",
  "firstReleaseTime",
  "surgePeriod",
  "lastTrainCrested",
] as const;
export type HeadlineKey = (typeof HEADLINE_KEYS)[number];
export type Headline = Record<HeadlineKey, number | null>;

export function headlineOf(summary: Record<string, unknown>): Headline {
  const out = {} as Headline;
  const times = dispatchTimes(summary as unknown as Pick<Summary, "trains">) as unknown as Record<string, unknown>;
  for (const k of HEADLINE_KEYS) {
    const v = times[k] ?? summary[k];
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

/**
 * A finished case against the same case on the coarser mesh (the run's `diagnostics.meshCoarse`), judged with
 * the study's rules; null when the run holds no coarse comparison. A case whose acceptability differs between
 * the meshes, or whose checks changed state, is not settled: the study says so instead of flipping silently.
 */
export function caseMeshConfidence(
  inputs: EngineScenario,
  summary: Record<string, unknown>,
  diagnostics: Record<string, unknown> | null | undefined,
  requireNoArdCatch: boolean,
): CaseMeshConfidence | null {
  const coarse = diagnostics?.meshCoarse as { segments?: unknown; summary?: unknown } | null | undefined;
  if (!coarse || typeof coarse.segments !== "number" || !coarse.summary || typeof summary.segments !== "number") return null;
  const fine = judgeCase(inputs, summary, requireNoArdCatch);
  const rough = judgeCase(inputs, coarse.summary as Record<string, unknown>, requireNoArdCatch);
  const mc = meshConfidence(
    { segments: summary.segments, summary: summary as unknown as Summary, checks: fine.checks },
    { segments: coarse.segments, summary: coarse.summary as Summary, checks: rough.checks },
  );
  const verdictSettled = fine.acceptable === rough.acceptable && mc.flipped.length === 0 && mc.marginal.length === 0;
  return { ...mc, verdictSettled, coarseAcceptable: rough.acceptable };
}
