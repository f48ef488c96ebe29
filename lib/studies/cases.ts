/**
 * One study case's engine scenario: the study's base scenario with the case's parameter values put in (a
 * dispatch interval adds the following train and lengthens the run: lib/studies/dispatch.ts).
 * Pure (no database): the chain catalogue rows and the train's masses are handed in.
 */
import { parseScenario, type Scenario as EngineScenario, type FieldIssue } from "@/sim/schema";
import type { ChainSpecView } from "@/lib/chains/service";
import { LOADING_FRACTION, type StudyLoading } from "./schema";
import { dispatchScenario } from "./dispatch";

export type ChainValues = Pick<ChainSpecView, "id" | "designation" | "pitch" | "massPerLength" | "axialStiffness" | "breakingStrength">;

export interface TrainMasses {
  carMassEmpty: number;
  seatsPerCar: number;
  riderMass: number;
}

export interface CaseContext {
  chains: Map<number, ChainValues>;
  train: TrainMasses;
}

export type CaseValues = Record<string, number | string>;

/** The base scenario with `values` applied, validated by the engine; issues name the case's parameter. */
export function caseScenario(
  base: EngineScenario,
  values: CaseValues,
  ctx: CaseContext,
): { ok: true; scenario: EngineScenario } | { ok: false; issues: FieldIssue[] } {
  let s = structuredClone(base) as EngineScenario;
  for (const [key, v] of Object.entries(values)) {
    // Entry speed and loading apply to every train of the scenario.
    if (key === "entrySpeed") for (const t of s.trains) t.entrySpeed = Number(v);
    else if (key === "chainSpeed") s.drive.speed = Number(v);
    else if (key === "takeUpMass") s.takeUp.mass = Number(v);
    else if (key === "loading") {
      const t = ctx.train;
      for (const tr of s.trains) tr.carMass = t.carMassEmpty + t.seatsPerCar * t.riderMass * LOADING_FRACTION[v as StudyLoading];
    } else if (key === "chainSpec") {
      const c = ctx.chains.get(Number(v));
      if (!c) return { ok: false, issues: [{ path: "chainSpec", message: `chain ${v} is not in the catalogue` } as FieldIssue] };
      s.chain.pitch = c.pitch;
      s.chain.massPerLength = c.massPerLength;
      s.chain.axialStiffness = c.axialStiffness;
      s.chain.breakingStrength = c.breakingStrength;
    }
  }
  // Last, so the following trains copy the first train with the case's other values already in.
  if (values.dispatchInterval !== undefined) {
    const d = dispatchScenario(s, Number(values.dispatchInterval));
    if (!d.ok) return d;
    s = d.scenario;
  }
  const parsed = parseScenario(s);
  return parsed.ok ? { ok: true, scenario: parsed.scenario } : { ok: false, issues: parsed.issues };
}
