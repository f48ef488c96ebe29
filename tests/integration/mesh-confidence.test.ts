import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getModels } from "@/models";
import { simulate } from "@/sim/simulate";
import type { Scenario } from "@/sim/schema";
import { closeJobPool } from "@/lib/jobs/pool";
import { createStudy, getStudy } from "@/lib/studies/service";
import { waitForStudyDriver } from "@/lib/studies/driver";
import { meshConfidenceOf } from "@/lib/runs/mesh";
import { judgeCase } from "@/lib/studies/headline";
import type { StudyParameter } from "@/lib/studies/schema";
import { closeDb, makeOrganisation } from "./design-fixtures";
import { studyScenario } from "./study-fixtures";
import type { Actor } from "@/lib/http/actor";

let engineer: Actor;

beforeAll(async () => {
  engineer = (await makeOrganisation("mesh")).as.engineer;
});

afterAll(async () => {
  await closeJobPool();
  await closeDb();
});

const GRID: StudyParameter[] = [{ key: "entrySpeed", range: { from: 1, to: 3, step: 1 } }];

describe("mesh confidence of saved runs and study cases", () => {
  it("stores the coarse-mesh comparison with every case's run and case, and the study says where a verdict is unsettled", { timeout: 120_000 }, async () => {
    const { scenarioId } = await studyScenario(engineer, "Mesh confidence");
    const created = await createStudy(engineer, { scenarioId, name: "Entry speed (mesh)", parameters: GRID });
    await waitForStudyDriver(created.id);
    const view = await getStudy(engineer, created.id);
    expect(view.casesDone).toBe(3);

    const { StudyCase, Run } = getModels();
    const cases = await StudyCase.findAll({ where: { studyId: created.id }, order: [["idx", "ASC"]] });
    for (const c of cases) {
      const run = await Run.findByPk(c.runId!);
      const mc = meshConfidenceOf(run!.diagnostics);
      expect(mc, `run ${run!.id} holds its mesh confidence`).not.toBeNull();
      // The comparison is against half the run's segments (the engine may round a mesh to the loop).
      const fineSegments = Number((run!.summary as Record<string, unknown>).segments);
      expect(mc!.fineSegments).toBe(fineSegments);
      // Plumbing, not physics: the stored coarse figure is the one an independent run of the same stored inputs
      // at half the segments gives (the engine is deterministic).
      const coarse = simulate(run!.inputs as unknown as Scenario, { segments: Math.round(fineSegments / 2), series: false, frameBudget: 0 });
      expect(mc!.coarseSegments).toBe(coarse.summary.segments);
      const peak = mc!.figures.find((f) => f.key === "peakTension")!;
      expect(peak.fine).toBeCloseTo(Number((run!.summary as Record<string, unknown>).peakTension), 6);
      expect(peak.coarse).toBeCloseTo(coarse.summary.peakTension, 6);
      const rel = Math.abs(peak.fine! - peak.coarse!) / Math.abs(peak.fine!);
      expect(peak.converged).toBe(rel <= 0.02 || Math.abs(peak.fine! - peak.coarse!) <= 100);

      // The case is judged again at the coarse mesh with the study's own rule (no ARD catch allowed by default).
      const listed = view.cases!.find((x) => x.id === c.id)!;
      expect(listed.mesh).not.toBeNull();
      const coarseAcceptable = judgeCase(run!.inputs as unknown as Scenario, coarse.summary as unknown as Record<string, unknown>, true).acceptable;
      if (coarseAcceptable !== c.acceptable) expect(listed.mesh!.verdictSettled).toBe(false);
      if (!listed.mesh!.verdictSettled) expect(listed.mesh!.converged).toBe(false);
    }

    // The window names every case whose verdict is not settled on the mesh, and only then carries the warning.
    const unsettled = view.cases!.filter((c) => c.mesh!.verdictSettled === false);
    expect(view.window!.unsettled).toHaveLength(unsettled.length);
    expect(view.window!.text.includes("Not settled on the mesh")).toBe(unsettled.length > 0);
  });
});
