/**
 * Mesh confidence of a finished run, for its stored diagnostics: the same scenario again at the coarser mesh
 * (no series, no frames), its figures and checks compared with the run's (sim/confidence.ts). The coarse
 * summary is kept too, so a study can judge the coarse case with its own rules. An engine failure on the coarse
 * mesh is reported, never fails the run. Engine-only (no database): the worker thread and the seeds call it.
 */
import { simulate } from "@/sim/simulate";
import { designStatics } from "@/sim/statics";
import { evaluateChecks } from "@/sim/checks";
import { coarserSegments, meshConfidence, type MeshConfidence } from "@/sim/confidence";
import type { Scenario } from "@/sim/schema";
import type { Summary } from "@/sim/summary";

export interface MeshDiagnostics {
  meshConfidence: MeshConfidence | null;
  meshCoarse: { segments: number; summary: Summary } | null;
  meshError?: string;
}

/** `budgetMs`: wall time left for the coarse run (the run's own budget minus what it used); past it, no comparison. */
export function meshCheck(scenario: Scenario, summary: Summary, budgetMs?: number): MeshDiagnostics {
  try {
    const checksOf = (s: Summary) => evaluateChecks(s, designStatics(scenario), scenario.limits);
    if (budgetMs !== undefined && budgetMs <= 0) throw new Error("no time left in the run's budget for the coarse-mesh comparison");
    const budget = budgetMs !== undefined ? { wallTimeMs: budgetMs } : undefined;
    const coarse = simulate(scenario, { segments: coarserSegments(summary.segments), series: false, frameBudget: 0, budget });
    const confidence = meshConfidence(
      { segments: summary.segments, summary, checks: checksOf(summary) },
      { segments: coarse.summary.segments, summary: coarse.summary, checks: checksOf(coarse.summary) },
    );
    return { meshConfidence: confidence, meshCoarse: { segments: coarse.summary.segments, summary: coarse.summary } };
  } catch (err) {
    return { meshConfidence: null, meshCoarse: null, meshError: err instanceof Error ? err.message : String(err) };
  }
}
