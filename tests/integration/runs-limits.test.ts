import { afterAll, beforeAll, describe, expect, it } from "vitest";
import crypto from "node:crypto";
import { getModels } from "@/models";
import { closeJobPool, getJobPool } from "@/lib/jobs/pool";
import { runConfig } from "@/lib/runs/config";
import { cancelRun, getRun, startRun } from "@/lib/runs/service";
import { closeDb, expectHttpError, makeOrganisation } from "./design-fixtures";
import { finished, importForRuns, runCount, shortScenarioFile, waitForRow } from "./runs-fixtures";
import type { Actor } from "@/lib/http/actor";

let org: Awaited<ReturnType<typeof makeOrganisation>>;
let operator: Actor;
const saved = { ...process.env };

beforeAll(async () => {
  // One worker and no waiting places: the second run at a time must be refused.
  process.env.JOB_WORKERS = "1";
  process.env.JOB_QUEUE_MAX = "0";
  await closeJobPool();
  org = await makeOrganisation("run-limits");
  operator = org.as.operator; // operators may start runs of existing scenarios
});

afterAll(async () => {
  process.env = saved;
  await closeJobPool();
  await closeDb();
});

describe("a full queue", () => {
  it("answers 503 with Retry-After and stores nothing; a freed place takes the next run", async () => {
    expect(getJobPool().capacity).toBe(1);
    const { scenarioId } = await importForRuns(org.as.engineer, shortScenarioFile("Limits: queue", { duration: 600, segments: 200 }));
    const first = await startRun(operator, scenarioId, {});
    await waitForRow(first.id, (r) => r.status === "running");
    const before = await runCount(org.organisationId);
    const err = await expectHttpError(() => startRun(operator, scenarioId, {}), 503);
    expect(Number(err.headers["Retry-After"])).toBeGreaterThan(0);
    expect(await runCount(org.organisationId)).toBe(before);

    await cancelRun(operator, first.id);
    await finished(first.id);
    const next = await startRun(operator, scenarioId, {});
    expect(next.status).toBe("queued");
    await cancelRun(operator, next.id);
    await finished(next.id);
  });
});

describe("the result size limit", () => {
  it("fails a run whose result is larger than the limit, with a clear error and no blob", async () => {
    process.env.RUN_RESULT_MAX_BYTES = "2000";
    try {
      const { scenarioId } = await importForRuns(org.as.engineer, shortScenarioFile("Limits: blob"));
      const view = await startRun(operator, scenarioId, {});
      const row = await finished(view.id);
      expect(row.status).toBe("failed");
      const run = await getRun(operator, view.id);
      expect(run.errorCode).toBe("result-too-large");
      expect(run.error).toMatch(/more than the 2 KiB a run may store/);
      expect(run.resultBytes).toBeNull();
      // The summary is still kept, so the figures are not lost.
      expect(run.summary?.peakTension).toBeGreaterThan(0);
    } finally {
      delete process.env.RUN_RESULT_MAX_BYTES;
    }
  });
});

describe("the default limit", () => {
  it("is a blob MariaDB stores and returns intact (below its max_allowed_packet)", async () => {
    const limit = runConfig().resultMaxBytes;
    const { scenarioId } = await importForRuns(org.as.engineer, shortScenarioFile("Limits: big blob"));
    const { Run, Scenario } = getModels();
    const sc = (await Scenario.findByPk(scenarioId))!;
    // Random bytes do not compress: the worst case for a gzipped result of exactly the limit.
    const blob = crypto.randomBytes(limit);
    const row = await Run.create({
      organisationId: org.organisationId,
      scenarioId,
      liftRevisionId: sc.liftRevisionId,
      startedBy: null,
      inputs: {},
      solver: {},
      status: "failed",
      error: "test row: blob size check",
      queuedAt: new Date(),
    });
    await Run.update({ result: blob, resultBytes: blob.byteLength }, { where: { id: row.id } });
    const back = await Run.scope("withResult").findByPk(row.id);
    expect(back!.result!.byteLength).toBe(limit);
    expect(crypto.createHash("sha256").update(back!.result!).digest("hex")).toBe(crypto.createHash("sha256").update(blob).digest("hex"));
    await Run.update({ result: null, resultBytes: null }, { where: { id: row.id } });
  });
});
