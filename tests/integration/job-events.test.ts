/**
 * Progress of long jobs as server-sent events (lib/http/job-events.ts) through the domain streams the routes
 * answer: each state change of a calibration reaches its stream and the stream ends at done; a study, run by
 * the in-process pool and by a BullMQ worker on Redis, is followed to its end; another organisation's job is
 * 404 before any stream starts; a client that goes away stops the stream.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getModels } from "@/models";
import { closeJobPool } from "@/lib/jobs/pool";
import { closeRunQueue } from "@/lib/jobs/bullmq";
import { QUEUE_RUNNER } from "@/lib/jobs/dispatch";
import { startEngineWorker, type QueueWorker } from "@/lib/engine/queue-worker";
import { jobEvents } from "@/lib/http/job-events";
import { createRecording } from "@/lib/recordings/service";
import { calibrationEvents } from "@/lib/calibration/events";
import { getCalibration } from "@/lib/calibration/service";
import { studyEvents, studyListEvents, type StudyListLine } from "@/lib/studies/events";
import { studyIdsQuerySchema } from "@/lib/studies/http";
import { createStudy, getStudy, type StudyView } from "@/lib/studies/service";
import { runEvents } from "@/lib/runs/events";
import { startRun } from "@/lib/runs/service";
import type { RunView } from "@/lib/runs/serialize";
import type { CalibrationView } from "@/lib/calibration/service";
import { closeDb, expectHttpError, makeOrganisation } from "./design-fixtures";
import { opsFakes } from "./logbook-fixtures";
import { importForRuns, shortScenarioFile } from "./runs-fixtures";
import { studyScenario } from "./study-fixtures";

type Frame = { event: string; data: unknown } | { comment: string };

/**
 * Reads a `text/event-stream` body one event at a time. Source: WHATWG HTML Living Standard §9.2 (an event
 * is `event:` and `data:` lines ended by a blank line; a line starting with `:` is a comment).
 */
function events(res: Response) {
  const reader = res.body!.getReader();
  const dec = new TextDecoder();
  let buf = "";
  return {
    /** The next event or comment; null once the server closed the stream. */
    async next(): Promise<Frame | null> {
      for (;;) {
        for (let i = buf.indexOf("\n\n"); i >= 0; i = buf.indexOf("\n\n")) {
          const block = buf.slice(0, i);
          buf = buf.slice(i + 2);
          if (block.startsWith(":")) return { comment: block.slice(1).trim() };
          const event = /^event: (.*)$/m.exec(block)?.[1];
          const data = /^data: (.*)$/m.exec(block)?.[1];
          if (event && data !== undefined) return { event, data: JSON.parse(data) };
          // `retry:` alone: not an event.
        }
        const { value, done } = await reader.read();
        if (done) return null;
        buf += dec.decode(value, { stream: true });
      }
    },
    /** Every remaining event, up to the close. */
    async rest(): Promise<Frame[]> {
      const out: Frame[] = [];
      for (let f = await this.next(); f; f = await this.next()) out.push(f);
      return out;
    },
  };
}

const named = (frames: Frame[], event: string) => frames.filter((f): f is { event: string; data: unknown } => "event" in f && f.event === event);

let fakes: Awaited<ReturnType<typeof opsFakes>>;
let org: Awaited<ReturnType<typeof makeOrganisation>>;
let other: Awaited<ReturnType<typeof makeOrganisation>>;
let ids: Awaited<ReturnType<typeof importForRuns>>;
let recordingId = 0;
const saved = { ...process.env };

/** A calibration row no worker takes (it waits "in Redis"): the test moves it through its states itself. */
async function handMadeCalibration() {
  return getModels().Calibration.create({
    organisationId: org.organisationId,
    recordingId,
    scenarioId: ids.scenarioId,
    startedBy: null,
    options: { scenarioName: "Job events" },
    inputs: {},
    runner: QUEUE_RUNNER,
    queuedAt: new Date(),
  });
}

beforeAll(async () => {
  delete process.env.REDIS_URL;
  await closeJobPool();
  fakes = await opsFakes();
  org = await makeOrganisation("job-events");
  other = await makeOrganisation("job-events-other");
  ids = await importForRuns(org.as.engineer, shortScenarioFile("Job events", { duration: 8, segments: 12 }));
  const lines = ["time_s,takeup_mm"];
  for (let i = 0; i < 50; i++) lines.push(`${(i * 0.1).toFixed(1)},${(i % 7).toFixed(1)}`);
  const out = await createRecording(org.as.operator, {
    liftId: ids.liftId,
    name: "Job events trace",
    csv: lines.join("\n") + "\n",
    mapping: { time: "time_s", takeUpPosition: "takeup_mm" },
    units: { time: "s", length: "mm", force: "N", speed: "m/s", takeUpDirection: "down" },
  });
  if (!("recording" in out)) throw new Error("expected a stored recording");
  recordingId = out.recording.id;
}, 60_000);

afterAll(async () => {
  process.env = saved;
  await closeJobPool();
  await fakes.close();
  await closeDb();
});

describe("a calibration's event stream", () => {
  it("delivers each state change of the job as it is stored, then ends at done and closes", async () => {
    const { Calibration } = getModels();
    const row = await handMadeCalibration();
    const res = await calibrationEvents(org.as.viewer, recordingId, row.id, new AbortController().signal);
    // Source: WHATWG HTML Living Standard §9.2 (the event stream's media type).
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toContain("text/event-stream");
    const stream = events(res);
    const state = async () => {
      const f = await stream.next();
      expect(f && "event" in f ? f.event : f).toBe("progress");
      return (f as { data: { calibration: CalibrationView } }).data.calibration;
    };

    expect(await state()).toMatchObject({ id: row.id, status: "queued", progress: 0 });
    await Calibration.update({ status: "running", progress: 0.25, startedAt: new Date() }, { where: { id: row.id } });
    expect(await state()).toMatchObject({ status: "running", progress: 0.25 });
    await Calibration.update({ progress: 0.5 }, { where: { id: row.id } });
    expect(await state()).toMatchObject({ status: "running", progress: 0.5 });
    await Calibration.update({ status: "done", progress: 1, finishedAt: new Date() }, { where: { id: row.id } });
    expect(await state()).toMatchObject({ status: "done", progress: 1 });

    const rest = await stream.rest();
    expect(rest.map((f) => ("event" in f ? f.event : ":"))).toEqual(["end"]);
    // The end event is what the status route answers.
    expect((rest[0] as { data: unknown }).data).toEqual({ calibration: await getCalibration(org.as.viewer, recordingId, row.id) });
  });

  it("ends at once for a calibration that has already finished", async () => {
    const row = await handMadeCalibration();
    await getModels().Calibration.update({ status: "failed", error: "The fit did not converge." }, { where: { id: row.id } });
    const frames = await events(await calibrationEvents(org.as.viewer, recordingId, row.id, new AbortController().signal)).rest();
    expect(frames.map((f) => ("event" in f ? f.event : ":"))).toEqual(["progress", "end"]);
    expect(named(frames, "end")[0].data).toMatchObject({ calibration: { id: row.id, status: "failed", error: "The fit did not converge." } });
  });

  it("ends with the job gone when its row is deleted meanwhile", async () => {
    const row = await handMadeCalibration();
    const stream = events(await calibrationEvents(org.as.viewer, recordingId, row.id, new AbortController().signal));
    expect(await stream.next()).toMatchObject({ event: "progress" });
    await row.destroy();
    expect(await stream.rest()).toEqual([{ event: "end", data: { calibration: null } }]);
  });

  it("answers 404 to another organisation, before any stream", async () => {
    const row = await handMadeCalibration();
    const signal = new AbortController().signal;
    await expectHttpError(() => calibrationEvents(other.as.engineer, recordingId, row.id, signal), 404);
    await expectHttpError(() => calibrationEvents(other.as.engineer, recordingId, null, signal), 404);
    // The recording's own: a stream follows one named calibration.
    expect((await expectHttpError(() => calibrationEvents(org.as.viewer, recordingId, null, signal), 400)).issues[0].path).toBe("calibrationId");
    await expectHttpError(() => calibrationEvents(org.as.viewer, recordingId, row.id + 1_000_000, signal), 404);
    await getModels().Calibration.update({ status: "failed" }, { where: { id: row.id } });
  });

  it("stops when the client goes away", async () => {
    const row = await handMadeCalibration();
    const client = new AbortController();
    const stream = events(await calibrationEvents(org.as.viewer, recordingId, row.id, client.signal));
    expect(await stream.next()).toMatchObject({ event: "progress", data: { calibration: { status: "queued" } } });
    client.abort();
    expect(await stream.next()).toBeNull();
    await getModels().Calibration.update({ status: "failed" }, { where: { id: row.id } });
  });

  it("sends a keep-alive comment while nothing changes", async () => {
    const row = await handMadeCalibration();
    const client = new AbortController();
    const res = await jobEvents(
      {
        label: "keep-alive check",
        read: () => getCalibration(org.as.viewer, recordingId, row.id),
        finished: (c) => c.status === "done" || c.status === "failed",
        key: (c) => `${c.status}|${c.progress}`,
        gone: null,
        intervalMs: 10,
        heartbeatMs: 0,
      },
      client.signal,
    );
    const stream = events(res);
    expect(await stream.next()).toMatchObject({ event: "progress" });
    // Source: WHATWG HTML Living Standard §9.2 (a line starting with ":" is a comment, kept for keep-alive).
    expect(await stream.next()).toEqual({ comment: "keep-alive" });
    client.abort();
    await getModels().Calibration.update({ status: "failed" }, { where: { id: row.id } });
  });
});

describe("a study's event stream", () => {
  let studyScenarioId = 0;
  beforeAll(async () => {
    studyScenarioId = (await studyScenario(org.as.engineer, "Job events: study")).scenarioId;
  }, 60_000);

  /** Follows a new study to its end event and checks what the stream said on the way. */
  async function followStudy(name: string): Promise<StudyView> {
    const created = await createStudy(org.as.engineer, { scenarioId: studyScenarioId, name, parameters: [{ key: "entrySpeed", values: [4, 4.5, 5] }] });
    await expectHttpError(() => studyEvents(other.as.viewer, created.id, {}, new AbortController().signal), 404);
    const frames = await events(await studyEvents(org.as.viewer, created.id, { units: "si" }, new AbortController().signal)).rest();
    const progress = named(frames, "progress").map((f) => (f.data as { study: StudyView }).study);
    const ends = named(frames, "end");
    expect(ends).toHaveLength(1);
    expect(frames.at(-1)).toBe(ends[0]);
    // Cases only ever finish: the count never goes back.
    const counts = progress.map((s) => s.casesDone + s.casesFailed);
    expect(counts).toEqual([...counts].sort((a, b) => a - b));
    const end = (ends[0].data as { study: StudyView }).study;
    // The end event is what the study route answers.
    expect(end).toEqual(await getStudy(org.as.viewer, created.id, { units: "si" }));
    return end;
  }

  it("follows a study run by the in-process pool to its end", { timeout: 60_000 }, async () => {
    const end = await followStudy("Job events: pool");
    expect(end.mode).toBe("pool");
    expect(end.status).toBe("done");
    expect(end.casesDone).toBe(3);
  });

  it("follows a list's running studies on one stream, leaving out another organisation's, to their end", { timeout: 60_000 }, async () => {
    const created = await createStudy(org.as.engineer, { scenarioId: studyScenarioId, name: "Job events: list", parameters: [{ key: "entrySpeed", values: [4, 5] }] });
    const theirs = events(await studyListEvents(other.as.viewer, [created.id], new AbortController().signal));
    expect(await theirs.rest()).toEqual([
      { event: "progress", data: { items: [] } },
      { event: "end", data: { items: [] } },
    ]);
    const frames = await events(await studyListEvents(org.as.viewer, [created.id, created.id + 1_000_000], new AbortController().signal)).rest();
    const lines = named(frames, "progress").map((f) => (f.data as { items: StudyListLine[] }).items);
    expect(lines.every((items) => items.length === 1 && items[0].id === created.id)).toBe(true);
    const counts = lines.map(([l]) => l.casesDone + l.casesFailed);
    expect(counts).toEqual([...counts].sort((a, b) => a - b));
    expect(named(frames, "end")[0].data).toEqual({ items: [{ id: created.id, status: "done", casesTotal: 2, casesDone: 2, casesFailed: 0 }] });
    // The list's query names 1 to 100 ids.
    expect(studyIdsQuerySchema.safeParse({ ids: "3,7,7" }).data).toEqual({ ids: [3, 7] });
    for (const ids of [undefined, "", "3,,7", "seven", Array.from({ length: 101 }, (_, i) => i + 1).join(",")]) {
      expect(studyIdsQuerySchema.safeParse({ ids }).success, String(ids)).toBe(false);
    }
  });

  it("follows a study run by a BullMQ worker on Redis to its end", { timeout: 60_000 }, async () => {
    expect(process.env.TEST_REDIS_URL, "npm test starts redis-server and sets TEST_REDIS_URL").toBeTruthy();
    process.env.REDIS_URL = process.env.TEST_REDIS_URL;
    let worker: QueueWorker | null = null;
    try {
      worker = startEngineWorker({ concurrency: 1 });
      const end = await followStudy("Job events: queue");
      expect(end.mode).toBe("queue");
      expect(end.status).toBe("done");
      expect(end.casesDone).toBe(3);
    } finally {
      delete process.env.REDIS_URL;
      await worker?.close();
      await closeRunQueue();
    }
  });
});

describe("a run's event stream", () => {
  it("sends the run's progress, never going back, then ends with the finished run", { timeout: 60_000 }, async () => {
    const run = await startRun(org.as.operator, ids.scenarioId, {});
    await expectHttpError(() => runEvents(other.as.viewer, run.id, new AbortController().signal), 404);
    const frames = await events(await runEvents(org.as.viewer, run.id, new AbortController().signal)).rest();
    const progress = named(frames, "progress").map((f) => (f.data as { progress: number }).progress);
    expect(progress).toEqual([...progress].sort((a, b) => a - b));
    const ends = named(frames, "end");
    expect(ends).toHaveLength(1);
    expect(ends[0].data as RunView).toMatchObject({ id: run.id, status: "done", progress: 1 });
  });
});
