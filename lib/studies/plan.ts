/**
 * A study's plan, worked out before anything is stored: the chains it names (from the catalogue rows
 * loaded for it), its grid of cases, the solver settings and the stored settings every case is rebuilt
 * from. Pure: no database; every case must make a valid engine scenario, or nothing is planned (400).
 */
import type { ChainSpec } from "@/models/ChainSpec";
import type { Scenario as EngineScenario } from "@/sim/schema";
import type { SolverSettings } from "@/lib/runs/runner";
import { badRequest } from "@/lib/http/errors";
import { caseScenario, type CaseValues, type ChainValues, type TrainMasses } from "./cases";
import { expandGrid, MAX_STUDY_CASES, type CreateStudyInput } from "./schema";
import type { StoredStudySettings } from "./driver";

export interface StudyPlanInput {
  body: CreateStudyInput;
  organisationId: number;
  /** The validated engine scenario every case starts from (scenario, pinned revision, train, run overrides). */
  base: EngineScenario;
  train: TrainMasses;
  /** Catalogue rows of the chains the parameters name (missing ones are simply absent). */
  chainRows: Pick<ChainSpec, "id" | "organisationId" | "designation" | "pitch" | "massPerLength" | "axialStiffness" | "breakingStrength">[];
  defaultBudgetSeconds: number;
}

export interface StudyPlan {
  grid: CaseValues[];
  stored: StoredStudySettings;
}

/** The chains the study varies, in the order it names them; a chain outside the catalogue is a 400. */
function studyChains({ body, organisationId, chainRows }: StudyPlanInput): ChainValues[] {
  const at = body.parameters.findIndex((p) => p.key === "chainSpec");
  const ids = body.parameters.flatMap((p) => (p.key === "chainSpec" ? p.values : []));
  return ids.map((id) => {
    const row = chainRows.find((r) => r.id === id);
    if (!row || (row.organisationId !== null && row.organisationId !== organisationId)) {
      throw badRequest("The study names a chain that is not in the catalogue.", [
        { path: `parameters.${at}.values`, message: `chain ${id} is not in the catalogue` },
      ]);
    }
    const { designation, pitch, massPerLength, axialStiffness, breakingStrength } = row;
    return { id: row.id, designation, pitch, massPerLength, axialStiffness, breakingStrength };
  });
}

export function planStudy(input: StudyPlanInput): StudyPlan {
  const { requireNoArdCatch, frameBudget, budgetSeconds } = input.body.settings;
  const chains = studyChains(input);
  const grid = expandGrid(input.body.parameters);
  if (grid.length > MAX_STUDY_CASES) {
    throw badRequest(`The study has ${grid.length} cases; at most ${MAX_STUDY_CASES} are allowed.`, [
      { path: "parameters", message: `${grid.length} cases is more than ${MAX_STUDY_CASES}` },
    ]);
  }
  const solver: SolverSettings = {
    budgetSeconds: budgetSeconds ?? input.defaultBudgetSeconds,
    ...(frameBudget !== undefined ? { frameBudget } : {}),
  };
  const stored: StoredStudySettings = { requireNoArdCatch, solver, base: input.base, chains, train: input.train };
  // Every case must make a valid engine scenario before anything is stored.
  const ctx = { chains: new Map(chains.map((c) => [c.id, c])), train: stored.train };
  const issues = grid.flatMap((values, i) => {
    const r = caseScenario(input.base, values, ctx);
    return r.ok ? [] : r.issues.map((iss) => ({ path: `cases.${i}.${iss.path}`, message: `${iss.message} (case ${JSON.stringify(values)})` }));
  });
  if (issues.length) throw badRequest("Some cases of the study would not make a valid scenario.", issues.slice(0, 20));
  return { grid, stored };
}
