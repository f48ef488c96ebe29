import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getModels } from "@/models";
import { encodeResult, RESULT_FORMAT } from "@/lib/runs/result-format";
import { getRunResult, getRunResultStream } from "@/lib/runs/service";
import { closeDb, expectHttpError, makeOrganisation } from "./design-fixtures";
import { importForRuns, shortScenarioFile } from "./runs-fixtures";

let org: Awaited<ReturnType<typeof makeOrganisation>>;
let other: Awaited<ReturnType<typeof makeOrganisation>>;
let runId = 0;
let otherRunId = 0;

/** A finished run row holding `result` (as the engine's packed result would be stored). */
async function storedRun(o: typeof org, value: unknown): Promise<number> {
  const { scenarioId } = await importForRuns(o.as.engineer, shortScenarioFile(`Result stream ${o.organisationId}`));
  const { Run, Scenario } = getModels();
  const sc = (await Scenario.findByPk(scenarioId))!;
  const blob = Buffer.from(encodeResult(value));
  const row = await Run.create({
    organisationId: o.organisationId,
    scenarioId,
    liftRevisionId: sc.liftRevisionId,
    startedBy: null,
    inputs: {},
    solver: {},
    status: "done",
    summary: { peakTension: 123456.5, note: "ünïcode ✓", nothing: null },
    queuedAt: new Date(),
  });
  await Run.update({ result: blob, resultFormat: RESULT_FORMAT, resultBytes: blob.byteLength }, { where: { id: row.id } });
  return row.id;
}

// A result of the engine's shape, large enough for many chunks: 3 series of 60,000 f32 samples, an
// integer series, frames with nested arrays, values JSON cannot hold (NaN in a typed array), and notes.
function bigResult() {
  const n = 60_000;
  const t = Float64Array.from({ length: n }, (_, i) => i * 0.001);
  const wave = (k: number) => Float32Array.from({ length: n }, (_, i) => Math.sin(i * k) * 1e5 + 1 / (i + 1));
  const tension = wave(0.01);
  tension[5] = Number.NaN;
  return {
    series: { t, tension, speed: wave(0.002), takeUp: wave(0.0005), steps: Int32Array.from({ length: 500 }, (_, i) => i * 3) },
    frames: Array.from({ length: 40 }, (_, i) => ({ t: i * 0.25, x: Float32Array.from({ length: 300 }, (_, k) => k * 0.5 + i), label: `frame ${i}` })),
    notes: ["a short note", { kind: "info", at: [1, 2, 3] }],
  };
}

async function readAll(stream: ReadableStream<Uint8Array>, onChunk?: () => void): Promise<string> {
  const reader = stream.getReader();
  const dec = new TextDecoder();
  let text = "";
  for (;;) {
    const { value, done } = await reader.read();
    if (done) return text + dec.decode();
    onChunk?.();
    text += dec.decode(value, { stream: true });
  }
}

beforeAll(async () => {
  org = await makeOrganisation("result-stream");
  other = await makeOrganisation("result-stream-other");
  runId = await storedRun(org, bigResult());
  otherRunId = await storedRun(other, { series: { t: [0, 1, 2, 3, 4, 5, 6, 7, 8] } });
});

afterAll(async () => {
  delete process.env.RESULT_STREAMS_PER_ORG;
  await closeDb();
});

describe("the streamed JSON of a run's result", () => {
  it("is byte for byte the JSON of the whole result", async () => {
    const whole = JSON.stringify(await getRunResult(org.as.viewer, runId));
    const streamed = await readAll(await getRunResultStream(org.as.viewer, runId));
    expect(streamed.length).toBeGreaterThan(2_000_000);
    expect(streamed).toBe(whole);
    expect(await readAll(await getRunResultStream(other.as.viewer, otherRunId))).toBe(JSON.stringify(await getRunResult(other.as.viewer, otherRunId)));
    await expectHttpError(() => getRunResultStream(other.as.viewer, runId), 404);
  });

  it("lets other work run between its chunks", async () => {
    // Other requests are callbacks queued on the event loop: count how many run while the stream is read.
    let ticks = 0;
    let reading = true;
    const other = () => {
      ticks += 1;
      if (reading) setImmediate(other);
    };
    setImmediate(other);
    const atChunk: number[] = [];
    await readAll(await getRunResultStream(org.as.viewer, runId), () => atChunk.push(ticks));
    reading = false;
    expect(atChunk.length).toBeGreaterThan(20);
    // Between the first and the last chunk the loop ran other callbacks at nearly every chunk.
    expect(atChunk[atChunk.length - 1] - atChunk[0]).toBeGreaterThanOrEqual(atChunk.length - 2);
  });

  it("streams at most RESULT_STREAMS_PER_ORG results of one organisation at once; others are not held", async () => {
    process.env.RESULT_STREAMS_PER_ORG = "2";
    const a = await getRunResultStream(org.as.viewer, runId);
    const b = await getRunResultStream(org.as.viewer, runId);
    let thirdOpened = false;
    const third = getRunResultStream(org.as.viewer, runId).then((s) => {
      thirdOpened = true;
      return s;
    });
    // Another organisation's download is not behind them.
    await readAll(await getRunResultStream(other.as.viewer, otherRunId));
    expect(thirdOpened).toBe(false);
    await a.cancel();
    const c = await third;
    expect(thirdOpened).toBe(true);
    await b.cancel();
    await c.cancel();
  });
});

