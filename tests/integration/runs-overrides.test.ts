import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getModels } from "@/models";
import { closeJobPool } from "@/lib/jobs/pool";
import { parseStartRunBody } from "@/lib/runs/http";
import { getRun, getRunResult, listRuns, startRun } from "@/lib/runs/service";
import { createReport } from "@/lib/reports/service";
import { buildReportContent } from "@/lib/reports/content";
import type { Actor } from "@/lib/http/actor";
import { closeDb, expectHttpError, makeOrganisation } from "./design-fixtures";
import { finished, importForRuns, runCount, shortScenarioFile } from "./runs-fixtures";

/**
 * What-if runs: the run-start body's `overrides` (entry speed, chain speed, take-up mass) are applied by
 * the server, stored beside the scenario values they replaced, and change the computed result.
 */
let org: Awaited<ReturnType<typeof makeOrganisation>>;
let engineer: Actor;
let scenarioId: number;

beforeAll(async () => {
  org = await makeOrganisation("runs-whatif");
  engineer = org.as.engineer;
  ({ scenarioId } = await importForRuns(engineer, shortScenarioFile("Runs: what-if")));
});

afterAll(async () => {
  await closeJobPool();
  await closeDb();
});

/** POST /api/scenarios/{id}/runs as its route handler does it: parse the body, then start the run. */
async function post(body: string) {
  const req = new Request(`http://localhost/api/scenarios/${scenarioId}/runs`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body,
  });
  return startRun(engineer, scenarioId, await parseStartRunBody(req));
}

/** The lowest segment tension of the first replay frame (t = 0, chain at rest before the drive ramps). */
async function restingMinTension(runId: number): Promise<number> {
  const { result } = await getRunResult(engineer, runId);
  const frames = result.frames as { t: number; tensions: number[] }[];
  expect(frames[0]!.t).toBe(0);
  return Math.min(...frames[0]!.tensions);
}

describe("what-if overrides", () => {
  it("stores the overrides with the scenario values they replaced, and the result follows them", async () => {
    const plain = await post("{}");
    const whatIf = await post(JSON.stringify({ overrides: { takeUpMass: 7500 } }));
    expect(plain.overrides).toBeNull();
    expect(plain.overridesFrom).toBeNull();
    expect(whatIf.overrides).toEqual({ takeUpMass: 7500 });
    // The example lift hill's take-up mass (sim/examples/lift-hill-example.json).
    expect(whatIf.overridesFrom).toEqual({ takeUpMass: 5000 });
    expect((await finished(plain.id)).status).toBe("done");
    expect((await finished(whatIf.id)).status).toBe("done");

    // The run's read and the scenario's runs list both say what the run varied.
    const read = await getRun(engineer, whatIf.id);
    expect(read.overrides).toEqual({ takeUpMass: 7500 });
    expect(read.overridesFrom).toEqual({ takeUpMass: 5000 });
    const page = await listRuns(engineer, scenarioId, { page: 1, pageSize: 20, sort: "newest" });
    expect(page.items.find((r) => r.id === whatIf.id)?.overrides).toEqual({ takeUpMass: 7500 });
    expect(page.items.find((r) => r.id === plain.id)?.overrides).toBeNull();

    // The stored inputs are the scenario with only the take-up mass changed.
    const base = (await getRun(engineer, plain.id)).inputs as Record<string, Record<string, unknown>>;
    const varied = read.inputs as Record<string, Record<string, unknown>>;
    expect(varied.takeUp!.mass).toBe(7500);
    expect({ ...varied, takeUp: { ...varied.takeUp, mass: 5000 } }).toEqual(base);

    // Source: statics of a 2:1 gravity take-up: the hanging mass m is shared by the two strands round its
    // sprocket, so each carries T = m·g/2 (any machine design text on gravity take-ups). At rest that is
    // the slack-side (lowest) tension of the loop; the take-up hangs at the bottom of the loop.
    const g = base.run!.gravity as number;
    const tPlain = await restingMinTension(plain.id);
    const tWhatIf = await restingMinTension(whatIf.id);
    // Stored as float32: relative error below 6e-8 (IEEE 754 binary32); 1e-5 leaves room for rounding.
    expect(Math.abs(tPlain - (5000 * g) / 2) / tPlain).toBeLessThan(1e-5);
    expect(Math.abs(tWhatIf - (7500 * g) / 2) / tWhatIf).toBeLessThan(1e-5);
    expect(tWhatIf).toBeGreaterThan(tPlain);

    // The audit entry of the start records the overrides too.
    const { AuditEntry } = getModels();
    const audit = await AuditEntry.findOne({ where: { entity: "run", entityId: String(whatIf.id), action: "create" } });
    const after = (typeof audit!.after === "string" ? JSON.parse(audit!.after) : audit!.after) as Record<string, unknown>;
    expect(after.overrides).toEqual({ takeUpMass: 7500 });
  });

  it("applies entry speed and chain speed to the train and the drive", async () => {
    const view = await post(JSON.stringify({ overrides: { entrySpeed: 1.2, chainSpeed: 3 } }));
    expect(view.overrides).toEqual({ entrySpeed: 1.2, chainSpeed: 3 });
    // The example's entry speed and chain speed (sim/examples/lift-hill-example.json).
    expect(view.overridesFrom).toEqual({ entrySpeed: 2.2, chainSpeed: 2.5 });
    expect((await finished(view.id)).status).toBe("done");
    const inputs = (await getRun(engineer, view.id)).inputs as Record<string, Record<string, unknown>>;
    expect((inputs.trains as unknown as { entrySpeed: number }[])[0]!.entrySpeed).toBe(1.2);
    expect(inputs.drive!.speed).toBe(3);
  });

  it("gives a report of a what-if run its inputs and lists the overrides among the assumptions", async () => {
    const view = await post(JSON.stringify({ overrides: { takeUpMass: 6000 } }));
    expect((await finished(view.id)).status).toBe("done");
    const report = await createReport(engineer, { scenarioId, runId: view.id, units: "si" });
    const content = await buildReportContent((await getModels().Report.findByPk(report.id))!);
    expect(content.inputs.takeUp.mass).toBe(6000);
    // Source: the same statics of a 2:1 gravity take-up, T = m·g/2, on the report's own inputs.
    expect(content.statics.takeUpTension).toBeCloseTo((6000 * content.inputs.run.gravity) / 2, 6);
    expect(content.assumptions.find((a) => a.key === "whatIf")?.value).toBe("take-up mass 6000 kg (scenario: 5000 kg)");
  });

  it("answers bad overrides with 400 and the field path, and stores no run", async () => {
    const before = await runCount(org.organisationId);
    const cases: [string, string][] = [
      // Take-up mass has the scenario format's bounds: at least 10 kg (sim/schema.ts takeUp.mass).
      [JSON.stringify({ overrides: { takeUpMass: -500 } }), "overrides.takeUpMass"],
      // NaN is not JSON: a browser's JSON.stringify sends it as null, which is not a number.
      [JSON.stringify({ overrides: { takeUpMass: NaN } }), "overrides.takeUpMass"],
      ['{"overrides":{"takeUpMass":NaN}}', "(body)"],
      [JSON.stringify({ overrides: { chainSpeed: 0 } }), "overrides.chainSpeed"],
      [JSON.stringify({ overrides: { entrySpeed: "fast" } }), "overrides.entrySpeed"],
      [JSON.stringify({ overrides: { takeUpMass: 6000, windSpeed: 3 } }), "overrides"],
      [JSON.stringify({ overrides: [5000] }), "overrides"],
    ];
    for (const [body, path] of cases) {
      const err = await expectHttpError(() => post(body), 400);
      expect(err.issues.map((i) => i.path), body).toContain(path);
    }
    const extra = await expectHttpError(() => post(JSON.stringify({ overrides: { takeUpMass: 6000, windSpeed: 3 } })), 400);
    expect(extra.issues[0]!.message).toContain("windSpeed");
    // The service checks the varied scenario again, should a caller skip the body schema.
    const direct = await expectHttpError(() => startRun(engineer, scenarioId, { overrides: { takeUpMass: -1 } }), 400);
    expect(direct.issues.map((i) => i.path)).toContain("takeUp.mass");
    expect(await runCount(org.organisationId)).toBe(before);
  });
});
