import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { getModels } from "@/models";
import { closeJobPool } from "@/lib/jobs/pool";
import { closeRunQueue } from "@/lib/jobs/bullmq";
import { startEngineWorker, type QueueWorker } from "@/lib/engine/queue-worker";
import { cancelRun, startRun } from "@/lib/runs/service";
import { runEvents } from "@/lib/runs/events";
import { cancelStudy, createStudy } from "@/lib/studies/service";
import { waitForStudyDriver } from "@/lib/studies/driver";
import type { Actor } from "@/lib/http/actor";
import { HttpError } from "@/lib/http/errors";
import { closeDb, makeOrganisation } from "./design-fixtures";
import { finished, importForRuns, shortScenarioFile, waitForRow } from "./runs-fixtures";
import { finishedStudy, studyScenario, waitForStudy } from "./study-fixtures";

// One engine thread, as on the 2-core demo machine: the case where one organisation could hold it all.
const saved = { ...process.env };
let busy: Awaited<ReturnType<typeof makeOrganisation>>;
let quiet: Awaited<ReturnType<typeof makeOrganisation>>;
let longScenario = 0;
let shortScenario = 0;

beforeAll(async () => {
  process.env.JOB_WORKERS = "1";
  delete process.env.JOB_QUEUE_MAX;
  delete process.env.JOB_ORG_CONCURRENCY;
  await closeJobPool();
  busy = await makeOrganisation("fair-busy");
  quiet = await makeOrganisation("fair-quiet");
  // A run that keeps a thread busy until it is cancelled (600 s of simulated time on 1000 segments: minutes of engine time).
  longScenario = (await importForRuns(busy.as.engineer, shortScenarioFile("Fair share: long", { duration: 600, segments: 1000 }))).scenarioId;
  shortScenario = (await importForRuns(quiet.as.engineer, shortScenarioFile("Fair share: short"))).scenarioId;
});

afterEach(async () => {
  // Nothing of one test may keep running into the next.
  const { Run } = getModels();
  const open = await Run.findAll({ where: { organisationId: [busy.organisationId, quiet.organisationId], status: ["queued", "running"] } });
  for (const r of open) await cancelRun(busy.organisationId === r.organisationId ? busy.as.operator : quiet.as.operator, r.id).catch(() => undefined);
  for (const r of open) await finished(r.id);
});

afterAll(async () => {
  process.env = saved;
  await closeRunQueue();
  await closeJobPool();
  await closeDb();
});

/** Reads a run's server-sent events until its `end` event (the stream a browser follows), and returns it. */
async function endOfStream(actor: Actor, runId: number): Promise<{ id: number; status: string }> {
  const stream = (await runEvents(actor, runId, new AbortController().signal)).body!;
  const reader = stream.getReader();
  const dec = new TextDecoder();
  let buf = "";
  for (;;) {
    const { value, done } = await reader.read();
    if (done) throw new Error(`run ${runId}: the event stream closed without an end event`);
    buf += dec.decode(value, { stream: true });
    for (let i = buf.indexOf("\n\n"); i >= 0; i = buf.indexOf("\n\n")) {
      const block = buf.slice(0, i);
      buf = buf.slice(i + 2);
      if (/^event: end$/m.test(block)) {
        await reader.cancel();
        return JSON.parse(/^data: (.*)$/m.exec(block)![1]);
      }
    }
  }
}

/** Starts long runs for the busy organisation until the pool refuses one (its share is full). */
async function fillShare(): Promise<number[]> {
  const ids: number[] = [];
  for (let i = 0; i < 20; i++) {
    try {
      ids.push((await startRun(busy.as.operator, longScenario, { budgetSeconds: 600 })).id);
    } catch (err) {
      if (err instanceof HttpError && err.status === 503) return ids;
      throw err;
    }
  }
  throw new Error("the pool never refused the busy organisation's runs");
}

describe("cancelling the running job (pool mode)", () => {
  it("starts the next waiting run at once, and that run's event stream ends", async () => {
    const long = await startRun(busy.as.operator, longScenario, { budgetSeconds: 600 });
    await waitForRow(long.id, (r) => r.status === "running");
    // Same organisation, one thread: the short run waits behind the long one.
    const { scenarioId } = await importForRuns(busy.as.engineer, shortScenarioFile("Fair share: next"));
    const next = await startRun(busy.as.operator, scenarioId, {});
    expect((await getModels().Run.findByPk(next.id))!.status).toBe("queued");
    await cancelRun(busy.as.operator, long.id);
    const end = await endOfStream(busy.as.viewer, next.id);
    expect(end.status).toBe("done");
  });
});

describe("cancelling a study whose case is running (pool mode)", () => {
  it("starts the next waiting run at once, and that run's event stream ends", async () => {
    const { scenarioId } = await importForRuns(busy.as.engineer, shortScenarioFile("Fair share: study to cancel", { duration: 600, segments: 1000 }));
    const study = await createStudy(busy.as.engineer, {
      scenarioId,
      name: "Cancel while a case runs",
      parameters: [{ key: "takeUpMass", values: [4000, 4500] }],
      settings: { budgetSeconds: 600 },
    });
    await waitForStudy(busy.as.engineer, study.id, (s) => s.cases!.some((c) => c.status === "running"));
    // Same organisation, one thread, its share of running jobs taken by the study: the run waits.
    const { scenarioId: shortOwn } = await importForRuns(busy.as.engineer, shortScenarioFile("Fair share: after the study"));
    const next = await startRun(busy.as.operator, shortOwn, {});
    expect((await getModels().Run.findByPk(next.id))!.status).toBe("queued");
    await cancelStudy(busy.as.engineer, study.id);
    const end = await endOfStream(busy.as.viewer, next.id);
    expect(end.status).toBe("done");
    await waitForStudyDriver(study.id);
  });
});

describe("fair share between organisations (pool mode)", () => {
  it("one organisation's long runs neither refuse nor hold back another organisation's first run", async () => {
    const held = await fillShare();
    // Its share is a part of the pool, not all of it (9 places: 1 worker + 8 waiting).
    expect(held.length).toBeLessThan(9);
    const view = await startRun(quiet.as.operator, shortScenario, {});
    const end = await endOfStream(quiet.as.viewer, view.id);
    expect(end.status).toBe("done");
    // …while the busy organisation's runs are still in hand: the quiet one did not wait for them.
    const { Run } = getModels();
    expect(await Run.count({ where: { id: held, status: ["queued", "running"] } })).toBe(held.length);
  });

  it("a long study does not hold back another organisation's run", async () => {
    const { scenarioId } = await importForRuns(busy.as.engineer, shortScenarioFile("Fair share: long study", { duration: 600, segments: 1000 }));
    const study = await createStudy(busy.as.engineer, {
      scenarioId,
      name: "Long cases",
      parameters: [{ key: "takeUpMass", values: [4000, 4500, 5000, 5500, 6000, 6500, 7000, 7500] }],
      settings: { budgetSeconds: 600 },
    });
    await waitForStudy(busy.as.engineer, study.id, (s) => s.cases!.some((c) => c.status === "running"));
    const view = await startRun(quiet.as.operator, shortScenario, {});
    const end = await endOfStream(quiet.as.viewer, view.id);
    expect(end.status).toBe("done");
    const during = await waitForStudy(busy.as.engineer, study.id, () => true);
    expect(during.casesDone).toBe(0);
    await cancelStudy(busy.as.engineer, study.id);
    await waitForStudyDriver(study.id);
    expect(finishedStudy(await waitForStudy(busy.as.engineer, study.id, finishedStudy))).toBe(true);
  });
});

describe("the Redis queue", () => {
  let worker: QueueWorker | null = null;
  beforeAll(() => {
    expect(process.env.TEST_REDIS_URL, "npm test starts redis-server and sets TEST_REDIS_URL").toBeTruthy();
    process.env.REDIS_URL = process.env.TEST_REDIS_URL;
    worker = startEngineWorker({ concurrency: 1 });
  });
  afterAll(async () => {
    delete process.env.REDIS_URL;
    await worker?.close();
    await closeRunQueue();
  });

  it("starts the next waiting run once the running one is cancelled, and its event stream ends", async () => {
    const long = await startRun(busy.as.operator, longScenario, { budgetSeconds: 600 });
    await waitForRow(long.id, (r) => r.status === "running");
    const next = await startRun(busy.as.operator, longScenario, { duration: 8, segments: 30 });
    await cancelRun(busy.as.operator, long.id);
    const end = await endOfStream(busy.as.viewer, next.id);
    expect(end.status).toBe("done");
  });

  it("takes another organisation's run before the rest of a study queued ahead of it", async () => {
    const { scenarioId } = await studyScenario(busy.as.engineer, "Fair share: queued study");
    const study = await createStudy(busy.as.engineer, {
      scenarioId,
      name: "Many short cases",
      parameters: [{ key: "entrySpeed", range: { from: 0.5, to: 5.25, step: 0.25 } }],
    });
    expect(study.casesTotal).toBe(20);
    await waitForStudy(busy.as.engineer, study.id, (s) => s.casesDone >= 1);
    const view = await startRun(quiet.as.operator, shortScenario, {});
    const end = await endOfStream(quiet.as.viewer, view.id);
    expect(end.status).toBe("done");
    const { Run, StudyCase } = getModels();
    const mine = (await Run.findByPk(view.id))!;
    const caseRuns = (await StudyCase.findAll({ where: { studyId: study.id }, attributes: ["runId"] })).map((c) => c.runId!);
    const runs = await Run.findAll({ where: { id: caseRuns }, attributes: ["id", "startedAt"] });
    // Cases the worker started after the run was queued and before it started it: at most the one it
    // was already taking (one worker), not the rest of the study.
    const before = runs.filter((r) => r.startedAt && r.startedAt > mine.queuedAt && r.startedAt < mine.startedAt!).length;
    expect(before).toBeLessThanOrEqual(1);
    const done = await waitForStudy(busy.as.engineer, study.id, finishedStudy);
    expect(done.casesDone).toBe(20);
  });
});
