/**
 * Demo data: one finished study of the demo park (entry speed × loading on a coarse mesh) and a draft
 * design-check report, so a new user sees a window, a map and a report at once. The cases are computed
 * here with the engine and stored exactly as the job pool stores a run. Idempotent (matched by name).
 */
import type { Sequelize } from "sequelize";
import { initModels } from "@/models";
import type { SeedStep } from "@/lib/db/seeds";
import { demoAccount } from "@/lib/auth/demo-accounts";
import { engineScenarioInput } from "@/lib/scenarios/resolve";
import { parseScenario } from "@/sim/schema";
import { simulate } from "@/sim/simulate";
import { packEngineResult, type EngineResult } from "@/lib/runs/pack";
import { meshCheck } from "@/lib/runs/mesh-check";
import { RESULT_FORMAT } from "@/lib/runs/result-format";
import { runConfig } from "@/lib/runs/config";
import { DEMO_PARK } from "@/lib/demo/park";
import { caseScenario } from "./cases";
import { expandGrid, type StudyParameter } from "./schema";
import { headlineOf, judgeCase } from "./headline";
import type { StoredStudySettings } from "./driver";
import { DRAFT_REPORT } from "@/lib/reports/service";

export const DEMO_STUDY_NAME = "Emberline: entry speed window, empty and full";
const DEMO_SCENARIO = "Emberline: clean pick-up";
const PARAMETERS: StudyParameter[] = [
  { key: "entrySpeed", range: { from: 1.0, to: 3.5, step: 0.5 } },
  { key: "loading", values: ["empty", "full"] },
];

export async function seedDemoStudy(sequelize: Sequelize): Promise<void> {
  const m = initModels(sequelize);
  const org = await m.Organisation.findOne({ where: { slug: DEMO_PARK.slug } });
  if (!org) return;
  const engineer = await m.User.findOne({ where: { email: demoAccount("engineer").email } });
  const scenario = await m.Scenario.findOne({ where: { organisationId: org.id, name: DEMO_SCENARIO } });
  if (!scenario) return;
  let study = await m.Study.findOne({ where: { organisationId: org.id, name: DEMO_STUDY_NAME } });
  if (!study) {
    const [revision, train] = await Promise.all([m.LiftRevision.findByPk(scenario.liftRevisionId), m.Train.findByPk(scenario.trainId)]);
    if (!revision || !train) return;
    const input = engineScenarioInput(scenario, revision, train) as { run: Record<string, unknown> };
    const parsed = parseScenario({ ...input, run: { ...input.run, duration: 20, segments: 24 } });
    if (!parsed.ok) throw new Error(`The demo study's scenario does not validate: ${parsed.issues.map((i) => i.path).join(", ")}`);
    const cfg = runConfig();
    const stored: StoredStudySettings = {
      requireNoArdCatch: true,
      solver: { budgetSeconds: cfg.defaultBudgetSeconds },
      base: parsed.scenario,
      chains: [],
      train: { carMassEmpty: train.carMassEmpty, seatsPerCar: train.seatsPerCar, riderMass: train.riderMass },
    };
    const grid = expandGrid(PARAMETERS);
    const now = new Date();
    const created = await m.Study.create({
      organisationId: org.id,
      scenarioId: scenario.id,
      liftRevisionId: scenario.liftRevisionId,
      name: DEMO_STUDY_NAME,
      parameters: PARAMETERS,
      settings: stored as unknown as Record<string, unknown>,
      status: "done",
      mode: "pool",
      casesTotal: grid.length,
      casesDone: 0,
      driver: null,
      createdBy: engineer?.id ?? null,
      startedAt: now,
      finishedAt: null,
    });
    let done = 0;
    for (const [idx, values] of grid.entries()) {
      const built = caseScenario(parsed.scenario, values, { chains: new Map(), train: stored.train });
      if (!built.ok) continue;
      const t0 = performance.now();
      const result = simulate(built.scenario, { budget: { wallTimeMs: cfg.defaultBudgetSeconds * 1000 } });
      const wallTimeMs = Math.round(performance.now() - t0);
      const packed = packEngineResult(result as unknown as EngineResult);
      const run = await m.Run.create({
        organisationId: org.id,
        scenarioId: scenario.id,
        liftRevisionId: scenario.liftRevisionId,
        startedBy: engineer?.id ?? null,
        status: "done",
        progress: 1,
        inputs: built.scenario as unknown as Record<string, unknown>,
        solver: { ...stored.solver, run: built.scenario.run, studyId: created.id },
        summary: packed.summary,
        diagnostics: { ...packed.diagnostics, ...meshCheck(built.scenario, result.summary) },
        result: Buffer.from(packed.blob),
        resultFormat: RESULT_FORMAT,
        resultBytes: packed.blob.byteLength,
        wallTimeMs,
        runner: null,
        queuedAt: new Date(),
        startedAt: new Date(),
        finishedAt: new Date(),
      });
      const verdict = judgeCase(built.scenario, packed.summary, true);
      await m.StudyCase.create({
        studyId: created.id,
        organisationId: org.id,
        idx,
        values,
        status: "done",
        runId: run.id,
        headline: headlineOf(packed.summary),
        checks: verdict.checks as unknown[],
        acceptable: verdict.acceptable,
        error: null,
        wallTimeMs,
        finishedAt: new Date(),
      });
      done += 1;
    }
    await m.Study.update({ casesDone: done, finishedAt: new Date() }, { where: { id: created.id } });
    study = created;
  }
  // A draft report of the same scenario, with its first finished run and the study's window.
  const title = "Design check: Emberline clean pick-up";
  if (!(await m.Report.findOne({ where: { organisationId: org.id, title }, attributes: ["id"] }))) {
    const run = await m.Run.findOne({ where: { scenarioId: scenario.id, status: "done" }, order: [["id", "ASC"]], attributes: ["id", "liftRevisionId"] });
    if (!run) return;
    await m.Report.create({
      organisationId: org.id,
      scenarioId: scenario.id,
      liftRevisionId: run.liftRevisionId,
      runId: run.id,
      studyId: study.id,
      title,
      units: "si",
      authorId: engineer?.id ?? null,
      ...DRAFT_REPORT,
    });
  }
}

export const demoStudySeed: SeedStep = { name: "demo park: a finished study and a draft report", run: seedDemoStudy };
