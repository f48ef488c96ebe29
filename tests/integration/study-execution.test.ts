import { afterAll, beforeAll, describe, expect, it } from "vitest";
import os from "node:os";
import { getModels } from "@/models";
import { simulate } from "@/sim/simulate";
import { closeJobPool } from "@/lib/jobs/pool";
import { closeRunQueue } from "@/lib/jobs/bullmq";
import { startEngineWorker, type QueueWorker } from "@/lib/engine/queue-worker";
import { cancelStudy, createStudy, getStudy, recoverStudies, resumeStudy } from "@/lib/studies/service";
import { waitForStudyDriver } from "@/lib/studies/driver";
import { caseScenario } from "@/lib/studies/cases";
import { judgeCase } from "@/lib/studies/headline";
import { operatingWindow } from "@/lib/studies/window";
import { storedSettings } from "@/lib/studies/driver";
import type { StudyParameter } from "@/lib/studies/schema";
import { closeDb, expectHttpError, makeOrganisation } from "./design-fixtures";
import { finishedStudy, studyScenario, waitForStudy } from "./study-fixtures";
import { deterministic } from "./runs-fixtures";
import type { Actor } from "@/lib/http/actor";

let org: Awaited<ReturnType<typeof makeOrganisation>>;
let engineer: Actor;

// The heavy tests run dozens of engine cases on a shared machine: they say how long they may take, and
// every wait inside them stays below that.
const LONG = 150_000;
const WAIT = 140_000;

/** Pool mode: the study's driver in this process ends when every case has finished (an event, not a poll). */
async function poolStudyDone(actor: Actor, id: number) {
  await waitForStudyDriver(id);
  return getStudy(actor, id);
}

/** Most runs that were running at the same moment, from their stored start and end times. */
function peakOverlap(runs: { startedAt: Date | null; finishedAt: Date | null }[]): number {
  const edges = runs
    .filter((r) => r.startedAt && r.finishedAt)
    .flatMap((r) => [
      { t: r.startedAt!.getTime(), d: 1 },
      { t: r.finishedAt!.getTime(), d: -1 },
    ])
    // At the same millisecond an end comes before a start: touching is not overlapping.
    .sort((a, b) => a.t - b.t || a.d - b.d);
  let now = 0;
  let peak = 0;
  for (const e of edges) peak = Math.max(peak, (now += e.d));
  return peak;
}

// 11 entry speeds × 2 loadings = 22 cases.
const GRID: StudyParameter[] = [
  { key: "entrySpeed", range: { from: 0.5, to: 3, step: 0.25 } },
  { key: "loading", values: ["empty", "full"] },
];

beforeAll(async () => {
  org = await makeOrganisation("study");
  engineer = org.as.engineer;
});

afterAll(async () => {
  await closeRunQueue();
  await closeJobPool();
  await closeDb();
});

async function caseRunsSummaries(studyId: number) {
  const { StudyCase, Run } = getModels();
  const cases = await StudyCase.findAll({ where: { studyId }, order: [["idx", "ASC"]] });
  const out: Record<string, unknown>[] = [];
  for (const c of cases) {
    const run = await Run.findByPk(c.runId!);
    out.push(deterministic(run!.summary as Record<string, unknown>));
  }
  return out;
}

describe("a 22-case study through both execution modes", () => {
  let poolStudyId = 0;

  it("runs every case in the worker-thread pool, with progress and a window", { timeout: LONG }, async () => {
    const { scenarioId } = await studyScenario(engineer, "Study: pool mode");
    const created = await createStudy(engineer, { scenarioId, name: "Entry speed × loading (pool)", parameters: GRID });
    expect(created.casesTotal).toBe(22);
    expect(created.mode).toBe("pool");
    poolStudyId = created.id;
    const partial = await waitForStudy(engineer, created.id, (s) => s.casesDone >= 1, WAIT);
    expect(partial.cases!.some((c) => c.status === "done" && c.headline)).toBe(true); // partial results are visible
    const done = await poolStudyDone(engineer, created.id);
    expect(done.status).toBe("done");
    expect(done.casesDone + done.casesFailed).toBe(22);
    expect(done.casesDone).toBe(22);
    expect(done.secondsLeft).toBe(0);
    expect(done.window!.text.length).toBeGreaterThan(10);
  });

  it("gives identical figures through BullMQ on Redis", { timeout: LONG }, async () => {
    const redisUrl = process.env.TEST_REDIS_URL;
    expect(redisUrl, "npm test starts redis-server and sets TEST_REDIS_URL").toBeTruthy();
    process.env.REDIS_URL = redisUrl;
    let worker: QueueWorker | null = null;
    try {
      worker = startEngineWorker({ concurrency: 1 });
      const { StudyCase, Study } = getModels();
      const pool = await Study.findByPk(poolStudyId);
      const created = await createStudy(engineer, { scenarioId: pool!.scenarioId, name: "Entry speed × loading (queue)", parameters: GRID });
      expect(created.mode).toBe("queue");
      const done = await waitForStudy(engineer, created.id, finishedStudy, WAIT);
      expect(done.status).toBe("done");
      expect(done.casesDone).toBe(22);
      // Every case's run was taken by a worker from Redis, not by the in-process driver.
      const cases = await StudyCase.findAll({ where: { studyId: created.id } });
      const runs = await getModels().Run.findAll({ where: { id: cases.map((c) => c.runId!) } });
      expect(runs.every((r) => r.runner !== "redis-queue:0:0" && r.status === "done")).toBe(true);

      // Plumbing, not physics: the pool and the queue store the same figures (the engine is deterministic).
      const a = await caseRunsSummaries(poolStudyId);
      const b = await caseRunsSummaries(created.id);
      expect(b).toEqual(a);
      const poolView = await waitForStudy(engineer, poolStudyId, finishedStudy);
      expect(done.cases!.map((c) => [c.values, c.headline, c.acceptable])).toEqual(poolView.cases!.map((c) => [c.values, c.headline, c.acceptable]));
      expect(done.window).toEqual(poolView.window);
    } finally {
      delete process.env.REDIS_URL;
      await worker?.close();
      await closeRunQueue();
    }
  });

  it("states the window that single engine runs of each grid point give", async () => {
    const { Study } = getModels();
    const view = await waitForStudy(engineer, poolStudyId, finishedStudy);
    const study = (await Study.findByPk(poolStudyId))!;
    const st = storedSettings(study);
    // The cases ran at the mesh the study chose before its grid.
    expect(st.mesh!.segments).toBe(view.mesh!.segments);
    // Plumbing, not physics: the study's window equals the one single runs of every grid point at that mesh give
    // (simulate + evaluateChecks, outside the study machinery); the engine's physics is checked in tests/sim.
    const expected = view.cases!.map((c) => {
      const built = caseScenario(st.base, c.values, { chains: new Map(), train: st.train });
      if (!built.ok) throw new Error("case did not build");
      const r = simulate(built.scenario, { segments: st.mesh!.segments });
      return { values: c.values, status: "done", acceptable: judgeCase(built.scenario, r.summary as never, true).acceptable };
    });
    const known = operatingWindow(GRID, expected, { units: "si" });
    expect(view.window!.groups).toEqual(known.groups);
    // The study adds a sentence naming cases whose verdict is not settled on its mesh.
    expect(view.window!.text.slice(0, known.text.length)).toBe(known.text);
    // The full train's cars weigh 1000 + 4 × 75 kg (by hand from the test's own train, set in study-fixtures.ts).
    const full = expected.find((e) => e.values.loading === "full")!;
    const built = caseScenario(st.base, full.values, { chains: new Map(), train: st.train });
    expect(built.ok && built.scenario.trains[0]!.carMass).toBe(1300);
    // Each group names its loading and, where there is one, its interval in m/s.
    for (const g of known.groups) {
      for (const [lo, hi] of g.intervals) expect(view.window!.text).toContain(lo === hi ? `${lo.toFixed(2)} m/s` : `${lo.toFixed(2)}–${hi.toFixed(2)} m/s`);
    }
  });
});

describe("per-organisation limits in the queue mode", () => {
  it("never runs more of one organisation's jobs at once than JOB_ORG_CONCURRENCY, with two workers", { timeout: LONG }, async () => {
    process.env.REDIS_URL = process.env.TEST_REDIS_URL;
    process.env.JOB_ORG_CONCURRENCY = "1";
    // Two engine threads, so two jobs could run at once if the limit let them.
    await closeJobPool();
    process.env.JOB_WORKERS = "2";
    const workers: QueueWorker[] = [];
    try {
      workers.push(startEngineWorker({ concurrency: 1 }), startEngineWorker({ concurrency: 1 }));
      const { scenarioId } = await studyScenario(engineer, "Study: organisation limit");
      const created = await createStudy(engineer, { scenarioId, name: "Limited", parameters: [{ key: "takeUpMass", values: [4000, 4500, 5000, 5500, 6000] }] });
      const { Run, StudyCase } = getModels();
      const done = await waitForStudy(engineer, created.id, finishedStudy, WAIT);
      // Each case run's stored start and end: no two overlap in time.
      const ids = (await StudyCase.findAll({ where: { studyId: created.id }, attributes: ["runId"] })).map((c) => c.runId!);
      const runs = await Run.findAll({ where: { id: ids }, attributes: ["id", "startedAt", "finishedAt"] });
      const peak = peakOverlap(runs);
      expect(done.casesDone).toBe(5);
      expect(peak).toBeLessThanOrEqual(1);
    } finally {
      delete process.env.REDIS_URL;
      delete process.env.JOB_ORG_CONCURRENCY;
      for (const w of workers) await w.close();
      await closeRunQueue();
      delete process.env.JOB_WORKERS;
      await closeJobPool();
    }
  });
});

describe("cancel and resume", () => {
  it("cancels a study, keeps its finished cases, and resumes the rest", { timeout: LONG }, async () => {
    const { scenarioId } = await studyScenario(engineer, "Study: cancel and resume");
    const created = await createStudy(engineer, {
      scenarioId,
      name: "Cancel me",
      parameters: [{ key: "entrySpeed", range: { from: 0.5, to: 5.25, step: 0.25 } }],
    });
    expect(created.casesTotal).toBe(20);
    await waitForStudy(engineer, created.id, (s) => s.casesDone >= 3, WAIT);
    const cancelled = await cancelStudy(engineer, created.id);
    expect(cancelled.status).toBe("cancelled");
    await waitForStudyDriver(created.id);
    await expectHttpError(() => cancelStudy(engineer, created.id), 409);
    const kept = cancelled.cases!.filter((c) => c.status === "done").map((c) => [c.id, c.runId]);
    expect(kept.length).toBeGreaterThanOrEqual(3);
    expect(kept.length).toBeLessThan(20);
    expect(cancelled.cases!.some((c) => c.status === "cancelled")).toBe(true);

    const resumed = await resumeStudy(engineer, created.id);
    expect(["queued", "running"]).toContain(resumed.status);
    const done = await poolStudyDone(engineer, created.id);
    expect(done.status).toBe("done");
    expect(done.casesDone).toBe(20);
    // The finished cases kept their runs: nothing was run twice.
    const after = new Map(done.cases!.map((c) => [c.id, c.runId]));
    for (const [id, runId] of kept) expect(after.get(id!)).toBe(runId);
  });

  it("resumes a study whose driving process died, keeping the finished cases", { timeout: LONG }, async () => {
    const { scenarioId } = await studyScenario(engineer, "Study: restart");
    const created = await createStudy(engineer, {
      scenarioId,
      name: "Restart me",
      parameters: [{ key: "takeUpMass", values: [4000, 4500, 5000, 5500, 6000, 6500] }],
    });
    await waitForStudy(engineer, created.id, (s) => s.casesDone >= 2, WAIT);
    const stopped = await cancelStudy(engineer, created.id);
    await waitForStudyDriver(created.id);
    const kept = stopped.cases!.filter((c) => c.status === "done").map((c) => [c.id, c.runId]);
    // Make it look like a server that died mid-study: running, driven by a process that no longer exists,
    // its open cases' runs interrupted.
    const { Study, StudyCase, Run } = getModels();
    const dead = `${os.hostname()}:999999:1`;
    await Study.update({ status: "running", driver: dead, finishedAt: null }, { where: { id: created.id } });
    const open = await StudyCase.findAll({ where: { studyId: created.id, status: "cancelled" } });
    for (const c of open) {
      if (c.runId) await Run.update({ status: "running", runner: dead, finishedAt: null }, { where: { id: c.runId } });
      await StudyCase.update({ status: c.runId ? "running" : "queued" }, { where: { id: c.id } });
    }
    expect(await recoverStudies()).toBeGreaterThanOrEqual(1);
    const done = await poolStudyDone(engineer, created.id);
    expect(done.status).toBe("done");
    expect(done.casesDone).toBe(6);
    const after = new Map(done.cases!.map((c) => [c.id, c.runId]));
    for (const [id, runId] of kept) expect(after.get(id!)).toBe(runId);
  });

  it("refuses bad definitions with field paths and stores nothing", async () => {
    const { scenarioId } = await studyScenario(engineer, "Study: bad input");
    const before = await getModels().Study.count({ where: { organisationId: org.organisationId } });
    const e1 = await expectHttpError(() => createStudy(engineer, { scenarioId, name: "x", parameters: [] }), 400);
    expect(e1.issues.map((i) => i.path)).toContain("parameters");
    const e2 = await expectHttpError(
      () => createStudy(engineer, { scenarioId, name: "x", parameters: [{ key: "entrySpeed", range: { from: 2, to: 1, step: 0.1 } }] }),
      400,
    );
    expect(e2.issues.map((i) => i.path)).toContain("parameters.0.range.to");
    const e3 = await expectHttpError(() => createStudy(engineer, { scenarioId, name: "x", parameters: [{ key: "chainSpeed", values: [50] }] }), 400);
    expect(e3.issues[0].path).toMatch(/^cases\.0\.drive\.speed/);
    await expectHttpError(() => createStudy(org.as.viewer, { scenarioId, name: "x", parameters: GRID }), 403);
    const other = await makeOrganisation("study-other");
    await expectHttpError(() => createStudy(other.as.engineer, { scenarioId, name: "x", parameters: GRID }), 404);
    expect(await getModels().Study.count({ where: { organisationId: org.organisationId } })).toBe(before);
  });
});
