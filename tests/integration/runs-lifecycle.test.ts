import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getModels } from "@/models";
import { simulate } from "@/sim/simulate";
import { closeJobPool } from "@/lib/jobs/pool";
import { updateLift, getLift } from "@/lib/lifts/service";
import { updateScenario, getScenario } from "@/lib/scenarios/service";
import { cancelRun, deleteRun, getRun, getRunResult, listRuns, startRun } from "@/lib/runs/service";
import { decodeResult } from "@/lib/runs/result-format";
import { recoverInterruptedRuns, INTERRUPTED_MESSAGE } from "@/lib/runs/recover";
import { closeDb, expectHttpError, makeOrganisation } from "./design-fixtures";
import { deterministic, finished, importForRuns, runCount, shortScenarioFile, waitForRow } from "./runs-fixtures";
import type { Actor } from "@/lib/http/actor";

let org: Awaited<ReturnType<typeof makeOrganisation>>;
let other: Awaited<ReturnType<typeof makeOrganisation>>;
let engineer: Actor;

beforeAll(async () => {
  org = await makeOrganisation("runs");
  other = await makeOrganisation("runs-other");
  engineer = org.as.engineer;
});

afterAll(async () => {
  await closeJobPool();
  await closeDb();
});

describe("a run from queued to done", () => {
  it("answers queued at once, then stores the same summary as a direct engine call", async () => {
    const { scenarioId } = await importForRuns(engineer, shortScenarioFile("Runs: queued to done"));
    const view = await startRun(engineer, scenarioId, {});
    expect(view.status).toBe("queued");
    expect(view.progress).toBe(0);
    expect(view.startedBy).toBe(engineer.id);

    const row = await finished(view.id);
    expect(row.status).toBe("done");
    const run = await getRun(engineer, view.id);
    expect(run.progress).toBe(1);
    expect(run.startedAt).not.toBeNull();
    expect(new Date(run.finishedAt!).getTime()).toBeGreaterThanOrEqual(new Date(run.startedAt!).getTime());
    expect(run.resultBytes).toBeGreaterThan(0);
    expect(run.version).toBeGreaterThanOrEqual(2); // queued → running → done

    // Plumbing, not physics: the stored run carries exactly the figures the engine gives for its stored inputs
    // (the engine is deterministic; its physics is checked against references in tests/sim).
    const direct = simulate(run.inputs);
    expect(deterministic(run.summary!)).toEqual(deterministic(direct.summary as unknown as Record<string, unknown>));

    const result = await getRunResult(engineer, view.id);
    expect(result.format).toBe("tautline-result/1");
    const series = result.result.series as Record<string, number[]>;
    expect(series.t.length).toBe(direct.series.t.length);
    for (const i of [0, Math.floor(series.t.length / 2), series.t.length - 1]) {
      // Stored as float32: 24-bit mantissa, relative error below 6e-8 (IEEE 754 binary32); rounded to 7 digits for JSON.
      expect(series.maxTension[i]).toBeCloseTo(direct.series.maxTension[i], -1);
      expect(Math.abs(series.trainSpeed[i] - direct.series.trainSpeed[i])).toBeLessThan(1e-5 * Math.max(1, Math.abs(direct.series.trainSpeed[i])));
    }
    expect((result.result.frames as unknown[]).length).toBe(direct.frames.length);

    const page = await listRuns(engineer, scenarioId, { page: 1, pageSize: 20, sort: "newest" });
    expect(page.total).toBe(1);
    expect(page.items[0]!.id).toBe(view.id);
  });

  it("applies solver overrides and stores them with the run", async () => {
    const { scenarioId } = await importForRuns(engineer, shortScenarioFile("Runs: overrides"));
    const view = await startRun(engineer, scenarioId, { segments: 24, duration: 5, frameBudget: 50 });
    await finished(view.id);
    const run = await getRun(engineer, view.id);
    expect(run.status).toBe("done");
    expect((run.inputs!.run as Record<string, unknown>).segments).toBe(24);
    expect((run.inputs!.run as Record<string, unknown>).duration).toBe(5);
    expect(run.solver.frameBudget).toBe(50);
    const { blob } = await import("@/lib/runs/service").then((m) => m.getRunResultBlob(engineer, view.id));
    const decoded = decodeResult(blob) as { frames: unknown[] };
    expect(decoded.frames.length).toBeLessThanOrEqual(51);
  });

  it("refuses invalid inputs with the field path and stores nothing", async () => {
    const { scenarioId } = await importForRuns(engineer, shortScenarioFile("Runs: invalid"));
    const before = await runCount(org.organisationId);
    // segments 2 is below the engine's bound of 4 (sim/schema.ts).
    const err = await expectHttpError(() => startRun(engineer, scenarioId, { segments: 2 } as never), 400);
    expect(err.issues.map((i) => i.path)).toContain("run.segments");
    expect(await runCount(org.organisationId)).toBe(before);
  });

  it("keeps runs inside their organisation", async () => {
    const { scenarioId } = await importForRuns(engineer, shortScenarioFile("Runs: scoping"));
    const view = await startRun(engineer, scenarioId, {});
    await finished(view.id);
    const stranger = other.as.engineer;
    await expectHttpError(() => getRun(stranger, view.id), 404);
    await expectHttpError(() => getRunResult(stranger, view.id), 404);
    await expectHttpError(() => cancelRun(stranger, view.id), 404);
    await expectHttpError(() => deleteRun(stranger, view.id, String(view.version)), 404);
    await expectHttpError(() => startRun(stranger, scenarioId, {}), 404);
    await expectHttpError(() => listRuns(stranger, scenarioId, { page: 1, pageSize: 20, sort: "newest" }), 404);
  });
});

describe("cancellation", () => {
  it("stops a running run, marks it cancelled and keeps no result", async () => {
    // 600 s of simulated time on 200 segments takes far longer than this test waits.
    const { scenarioId } = await importForRuns(engineer, shortScenarioFile("Runs: cancel", { duration: 600, segments: 200 }));
    const view = await startRun(engineer, scenarioId, {});
    await waitForRow(view.id, (r) => r.status === "running");
    const t0 = Date.now();
    const cancelled = await cancelRun(engineer, view.id);
    expect(cancelled.status).toBe("cancelled");
    expect(Date.now() - t0).toBeLessThan(5_000);
    const row = await finished(view.id);
    expect(row.status).toBe("cancelled");
    const run = await getRun(engineer, view.id);
    expect(run.resultBytes).toBeNull();
    expect(run.finishedAt).not.toBeNull();
    await expectHttpError(() => getRunResult(engineer, view.id), 409);
    await expectHttpError(() => cancelRun(engineer, view.id), 409);
    const { AuditEntry } = getModels();
    const audit = await AuditEntry.findAll({ where: { entity: "run", entityId: String(view.id) }, order: [["id", "ASC"]] });
    expect(audit.map((a) => a.action)).toEqual(["create", "update"]);
  });
});

describe("budget", () => {
  it("fails a run that exceeds its budget and stores the engine's diagnostic", async () => {
    const { scenarioId } = await importForRuns(engineer, shortScenarioFile("Runs: budget", { duration: 600, segments: 200 }));
    const view = await startRun(engineer, scenarioId, { budgetSeconds: 0.3 });
    const row = await finished(view.id);
    expect(row.status).toBe("failed");
    const run = await getRun(engineer, view.id);
    // Plumbing, not physics: the stored code is the engine's name for the wall-time budget failure (sim/errors.ts).
    expect(run.errorCode).toBe("budget-time");
    expect(run.error).toBeTruthy();
    expect(run.error!.length).toBeGreaterThan(10);
    expect(run.diagnostics?.simulatedTime).toBeGreaterThan(0);
    expect(run.resultBytes).toBeNull();
  });
});

describe("revision pinning", () => {
  it("leaves a run's stored inputs unchanged when the lift is edited and the scenario re-pinned", async () => {
    const ids = await importForRuns(engineer, shortScenarioFile("Runs: pinning"));
    const first = await startRun(engineer, ids.scenarioId, {});
    await finished(first.id);
    const before = await getRun(engineer, first.id);
    expect((before.inputs!.drive as Record<string, number>).speed).toBe(2.5);

    const lift = await getLift(engineer, ids.liftId);
    const updated = await updateLift(engineer, ids.liftId, { version: lift.version, drive: { speed: 3.1 }, changeSummary: "Faster chain" });
    expect(updated.currentRevision.id).not.toBe(before.liftRevisionId);
    const scenario = await getScenario(engineer, ids.scenarioId);
    await updateScenario(engineer, ids.scenarioId, { version: scenario.version, liftRevisionId: updated.currentRevision.id });

    const after = await getRun(engineer, first.id);
    expect(after.inputs).toEqual(before.inputs);
    expect(after.liftRevisionId).toBe(before.liftRevisionId);
    expect(after.summary).toEqual(before.summary);

    const second = await startRun(engineer, ids.scenarioId, {});
    await finished(second.id);
    const run2 = await getRun(engineer, second.id);
    expect(run2.liftRevisionId).toBe(updated.currentRevision.id);
    expect((run2.inputs!.drive as Record<string, number>).speed).toBe(3.1);
  });
});

describe("deleting", () => {
  it("needs the version the caller saw and records an audit entry", async () => {
    const { scenarioId } = await importForRuns(engineer, shortScenarioFile("Runs: delete"));
    const view = await startRun(engineer, scenarioId, {});
    await finished(view.id);
    const run = await getRun(engineer, view.id);
    await expectHttpError(() => deleteRun(engineer, view.id, null), 400);
    await expectHttpError(() => deleteRun(engineer, view.id, String(run.version + 5)), 409);
    await deleteRun(engineer, view.id, String(run.version));
    await expectHttpError(() => getRun(engineer, view.id), 404);
    const { AuditEntry } = getModels();
    const actions = (await AuditEntry.findAll({ where: { entity: "run", entityId: String(view.id) } })).map((a) => a.action);
    expect(actions).toContain("delete");
  });
});

describe("restart", () => {
  it("marks runs of a process that is gone as failed, and leaves a live process's runs alone", async () => {
    const { scenarioId } = await importForRuns(engineer, shortScenarioFile("Runs: restart"));
    const { Run, Scenario } = getModels();
    const sc = (await Scenario.findByPk(scenarioId))!;
    const base = {
      organisationId: org.organisationId,
      scenarioId,
      liftRevisionId: sc.liftRevisionId,
      startedBy: engineer.id,
      inputs: {},
      solver: {},
      queuedAt: new Date(),
    };
    // pid 2^22 + 1 is above Linux's largest pid (pid_max ≤ 2^22), so no process has it.
    const gone = await Run.create({ ...base, status: "running", runner: `${(await import("node:os")).hostname()}:4194305:1` });
    const live = await Run.create({ ...base, status: "queued", runner: `${(await import("node:os")).hostname()}:${process.ppid}:1` });
    await recoverInterruptedRuns();
    const g = (await Run.findByPk(gone.id))!;
    expect(g.status).toBe("failed");
    expect(g.error).toBe(INTERRUPTED_MESSAGE);
    expect((await Run.findByPk(live.id))!.status).toBe("queued");
    await live.update({ status: "failed", error: "test row" });
  });
});
