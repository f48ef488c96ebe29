import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createRecording, getRecording, overlay, saveCalibration } from "@/lib/recordings/service";
import { getCalibration, startCalibration } from "@/lib/calibration/service";
import { waitForCalibrationJob } from "@/lib/calibration/runner";
import { readUpload } from "@/lib/logbook/uploads";
import { getRunResult } from "@/lib/runs/service";
import { getLift } from "@/lib/lifts/service";
import { getModels } from "@/models";
import { closeDb, expectHttpError } from "./design-fixtures";
import { opsFakes, opsWorld } from "./logbook-fixtures";

let fakes: Awaited<ReturnType<typeof opsFakes>>;
let w: Awaited<ReturnType<typeof opsWorld>>;

beforeAll(async () => {
  fakes = await opsFakes();
  w = await opsWorld("rec", { run: true });
});
afterAll(async () => {
  await fakes.close();
  await closeDb();
});

async function counts(organisationId: number) {
  const { Recording, Upload } = getModels();
  return { recordings: await Recording.count({ where: { organisationId } }), uploads: await Upload.count({ where: { organisationId } }) };
}

const mapping = { time: "time_s", takeUpPosition: "takeup_mm", trainSpeed: "speed" };
const units = { time: "s", length: "mm", force: "N", speed: "m/s", takeUpDirection: "down" };

describe("logger uploads", () => {
  it("refuses a CSV with bad rows, listing every problem, and stores nothing", async () => {
    const before = await counts(w.organisationId);
    const csv = "time_s,takeup_mm,speed\n0,0,2.2\n0.02,x,2.2\n0.01,1,2.2\n0.06,2\n";
    const err = await expectHttpError(() => createRecording(w.as.operator, { liftId: w.liftId, name: "Bad", csv, mapping, units }), 400);
    expect(err.issues.map((i) => i.path)).toEqual(["rows.3.takeUpPosition", "rows.4.time", "rows.5"]);
    expect(await counts(w.organisationId)).toEqual(before);
  });

  it("stores a good one (rows in MariaDB, the file in object storage) and overlays it on a run at engagement", async () => {
    const run = await getRunResult(w.as.engineer, w.runId!);
    const series = (run.result as { series: Record<string, number[]> }).series;
    const eng = (run.summary as { engagementTime: number }).engagementTime;
    // A logger that started 1.5 s before the run's t = 0: the overlay must shift it back by 1.5 s.
    const lines = ["time_s,takeup_mm,speed"];
    series.t.forEach((t, i) => i % 5 === 0 && lines.push(`${(t + 1.5).toFixed(3)},${(series.takeUpPosition[i] * 1000).toFixed(3)},${series.trainSpeed[i].toFixed(4)}`));
    const csv = lines.join("\n") + "\n";
    const dry = await createRecording(w.as.operator, { liftId: w.liftId, name: "Dispatch", csv, mapping, units, dryRun: true, engagementTime: eng + 1.5 });
    expect("ok" in dry && dry.ok).toBe(true);
    expect(await counts(w.organisationId)).toEqual({ recordings: 0, uploads: 0 });
    const out = await createRecording(w.as.operator, { liftId: w.liftId, name: "Dispatch", fileName: "dispatch.csv", csv, mapping, units, engagementTime: eng + 1.5 });
    if (!("recording" in out)) throw new Error("expected a stored recording");
    expect(out.recording.sampleCount).toBe(lines.length - 1);
    const { series: s } = await getRecording(w.as.viewer, out.recording.id);
    expect(s.t).toHaveLength(lines.length - 1);
    const file = await readUpload(w.as.viewer, Number(out.recording.fileUrl!.split("/").pop()));
    expect(file.body.toString("utf8")).toBe(csv);
    const o = await overlay(w.as.viewer, out.recording.id, w.runId!);
    expect(o.aligned).toBe(true);
    expect(o.shift).toBeCloseTo(-1.5, 9);
    // Aligned, the recorded trace lies on the run's (it was made from it, rounded to 1 µm).
    const k = 40;
    const tRun = o.recording.t[k];
    const j = series.t.findIndex((t) => Math.abs(t - tRun) < 1e-6);
    expect(Math.abs(o.recording.takeUp[k]! - (series.takeUpPosition[j] - series.takeUpPosition[0]))).toBeLessThan(1e-5);
  });

  it("calibrates against the recording and saves the fit as a new lift revision", async () => {
    const { Recording, Calibration } = getModels();
    const rec = await Recording.findOne({ where: { organisationId: w.organisationId } });
    const job = await startCalibration(w.as.engineer, rec!.id, { scenarioId: w.scenarioId });
    await waitForCalibrationJob(job.id);
    const done = await getCalibration(w.as.engineer, rec!.id, job.id);
    expect(done.status).toBe("done");
    const fit = done.result!;
    expect(fit.quality.fitted.rms!).toBeLessThanOrEqual(fit.quality.initial.rms! + 1e-9);
    await expectHttpError(() => saveCalibration(w.as.operator, rec!.id, { version: 0, calibrationId: job.id }), 403);
    // Two finished fits of the same recording with set qualities: one the gate refuses, one it passes.
    const row = (await Calibration.findByPk(job.id))!.get({ plain: true }) as Record<string, unknown>;
    const withResult = (result: object) => Calibration.create({ ...row, id: undefined, inputs: row.inputs ?? {}, result } as never);
    const bad = await withResult({ ...fit, quality: { ...fit.quality, fitted: { rms: 0.012, rSquared: -0.318, samples: 300 } }, converged: false });
    const good = await withResult({ ...fit, fitted: { ...fit.fitted, axialStiffness: 1.6e7, damping: 3000 }, quality: { ...fit.quality, fitted: { rms: 0.0004, rSquared: 0.985, samples: 300 } }, converged: true });
    const lift = await getLift(w.as.engineer, w.liftId);
    const refused = await expectHttpError(() => saveCalibration(w.as.engineer, rec!.id, { version: lift.version, calibrationId: bad.id }), 409);
    expect(refused.message).toContain("R² = -0.318");
    expect(refused.message).toContain("stopped at its budget");
    expect((await getLift(w.as.engineer, w.liftId)).currentRevision.number).toBe(1);
    // Values in the request are not what is saved: the fit's own are.
    const saved = await saveCalibration(w.as.engineer, rec!.id, { version: lift.version, calibrationId: good.id, axialStiffness: 1, damping: 1 });
    expect(saved.currentRevision.number).toBe(2);
    expect(saved.changes.map((c) => c.path)).toEqual(expect.arrayContaining(["chain.axialStiffness", "chain.damping"]));
    const after = await getLift(w.as.engineer, w.liftId);
    expect(after.currentRevision.chain.axialStiffness).toBe(1.6e7);
    expect(after.currentRevision.chain.damping).toBe(3000);
  }, 60_000);
});

describe("logger headers", () => {
  it("reads a file with [ms] and [kN] headers in seconds and newtons, and says so in the check", async () => {
    const lines = ["Time [ms],Chain tension [kN],Take-up [mm]"];
    for (let k = 0; k <= 50; k++) lines.push(`${k * 20},${(12 + 0.1 * k).toFixed(1)},${(k / 10).toFixed(1)}`);
    const csv = lines.join("\n");
    const mapping = { time: "Time [ms]", chainTension: "Chain tension [kN]", takeUpPosition: "Take-up [mm]" };
    // The file-wide units say s and N (as the old defaults did): the headers govern their own columns.
    const input = { liftId: w.liftId, name: "Headers", csv, mapping, units: { time: "s", force: "N" } };
    const dry = await createRecording(w.as.operator, { ...input, dryRun: true });
    if (!("ok" in dry)) throw new Error("expected a check");
    expect(dry.units).toMatchObject({ time: { unit: "ms", from: "header" }, chainTension: { unit: "kN", from: "header" } });
    expect(dry.plot.length).toBeGreaterThan(10);
    const out = await createRecording(w.as.operator, input);
    if (!("recording" in out)) throw new Error("expected a stored recording");
    // Source: SI prefixes (BIPM SI Brochure): 50 × 20 ms = 1 s; 12 kN = 12 000 N.
    expect(out.recording.duration).toBeCloseTo(1, 12);
    const { series } = await getRecording(w.as.viewer, out.recording.id);
    expect(series.t[1]).toBeCloseTo(0.02, 12);
    expect(series.chainTension[0]).toBeCloseTo(12_000, 6);
    expect(series.takeUpPosition[50]).toBeCloseTo(0.005, 12);
  });
});
