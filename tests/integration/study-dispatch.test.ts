/**
 * A dispatch study on the real database and worker pool: three intervals, each case a run with the scenario's
 * train sent again one interval later; the per-case figures the plots read are stored; the mesh the cases ran at
 * was chosen first and is stored on the study. Bad intervals are refused in words and store nothing.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getModels } from "@/models";
import { closeJobPool } from "@/lib/jobs/pool";
import { createStudy, getStudy } from "@/lib/studies/service";
import { storedSettings, waitForStudyDriver } from "@/lib/studies/driver";
import type { Scenario } from "@/sim/schema";
import type { Actor } from "@/lib/http/actor";
import { closeDb, expectHttpError, makeOrganisation } from "./design-fixtures";
import { studyScenario } from "./study-fixtures";

let org: Awaited<ReturnType<typeof makeOrganisation>>;
let engineer: Actor;

beforeAll(async () => {
  org = await makeOrganisation("dispatch");
  engineer = org.as.engineer;
});

afterAll(async () => {
  await closeJobPool();
  await closeDb();
});

describe("a dispatch study over three intervals", () => {
  it("runs each case with the following train and stores its figures", { timeout: 150_000 }, async () => {
    const { scenarioId } = await studyScenario(engineer, "Dispatch: three intervals");
    const intervals = [20, 35, 50];
    const created = await createStudy(engineer, { scenarioId, name: "Dispatch interval", parameters: [{ key: "dispatchInterval", values: intervals }] });
    expect(created.casesTotal).toBe(3);
    await waitForStudyDriver(created.id);
    const view = await getStudy(engineer, created.id);
    expect(view.status).toBe("done");
    expect(view.casesDone).toBe(3);

    const { Run, Study } = getModels();
    const st = storedSettings((await Study.findByPk(created.id))!);
    expect(st.mesh).toBeDefined();
    expect(view.mesh!.segments).toBe(st.mesh!.segments);
    expect(view.mesh!.reason).toMatch(/^Cases run at \d+ segments/);
    for (const c of view.cases!) {
      const interval = Number(c.values.dispatchInterval);
      const run = (await Run.findByPk(c.runId!))!;
      const inputs = run.inputs as unknown as Scenario;
      // The scenario's train, and the same train one interval later.
      expect(inputs.trains).toHaveLength(2);
      expect(inputs.trains[1]).toEqual({ ...inputs.trains[0], startTime: inputs.trains[0].startTime + interval });
      expect(inputs.run.segments).toBe(st.mesh!.segments);
      // The run reaches past the second train's start by at least its way to the release point at chain speed
      // (Source: kinematics, time = distance / speed, from memory).
      const t = inputs.trains[0];
      expect(inputs.run.duration).toBeGreaterThan(interval + (inputs.lift.dogRelease + t.dogOffset - t.startPosition) / inputs.drive.speed);
      // The figures the plots read, stored with the case.
      expect(c.headline!.peakDriveTension).toBeGreaterThan(0);
      expect(c.headline!.peakTension).toBeGreaterThanOrEqual(c.headline!.peakDriveTension!);
      expect(c.headline!.takeUpMaxDrop).toBeGreaterThan(0);
      // The second train is picked up after it appears.
      expect(c.headline!.secondPickupTime).toBeGreaterThan(interval);
      expect(c.headline!.firstReleaseTime).not.toBeNull();
      expect((run.summary as { trains: unknown[] }).trains).toHaveLength(2);
    }
  });

  it("refuses intervals out of bounds, or too short for the train to clear its length, and stores nothing", async () => {
    const { scenarioId } = await studyScenario(engineer, "Dispatch: bad intervals");
    const before = await getModels().Study.count({ where: { organisationId: org.organisationId } });
    const e1 = await expectHttpError(() => createStudy(engineer, { scenarioId, name: "x", parameters: [{ key: "dispatchInterval", range: { from: 2, to: 20, step: 9 } }] }), 400);
    expect(e1.issues.find((i) => i.path === "parameters.0.range.from")?.message).toBe("Dispatch interval must be at least 5 s");
    // 6 cars of 2.6 m at 2.5 m/s clear their length in 6.24 s (the example lift): 6 s is too short.
    const e2 = await expectHttpError(() => createStudy(engineer, { scenarioId, name: "x", parameters: [{ key: "dispatchInterval", values: [6, 30] }] }), 400);
    expect(e2.issues[0].path).toBe("cases.0.dispatchInterval");
    expect(e2.issues[0].message).toMatch(/^Dispatch interval 6 s is shorter than the 6\.2 s the train needs to clear its own length/);
    expect(await getModels().Study.count({ where: { organisationId: org.organisationId } })).toBe(before);
  });
});
