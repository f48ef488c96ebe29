/**
 * Logger recordings: a dry run reports every problem; a store writes the file as received to object
 * storage and the parsed rows to MariaDB, attached to the lift's current revision. Also the overlay on a
 * run, and saving fitted values as a new revision (the fit itself is a job: lib/calibration/service.ts).
 */
import { assertCan, ownOr404, type Actor } from "@/lib/http/actor";
import { validate } from "@/lib/http/validate";
import { recordAudit } from "@/lib/audit/record";
import { getSequelize } from "@/lib/db/sequelize";
import { badRequest, HttpError } from "@/lib/http/errors";
import { discardUpload, storeRecordingFile } from "@/lib/logbook/uploads";
import { updateLift } from "@/lib/lifts/service";
import { findOwnRun, getRunResult } from "@/lib/runs/service";
import { getModels, type Recording } from "@/models";
import { fitVerdict } from "@/lib/calibration/gate";
import { toCalibrationView } from "@/lib/calibration/service";
import { runPickerOptions, type RunPickerOption } from "@/lib/runs/picker";
import type { SettleBackAccount } from "@/lib/runs/settle-back";
import type { UnitSystem } from "@/lib/units/display";
import { STANDARD_GRAVITY } from "@/sim/units";
import { alignAtEngagement, type OverlaySeries } from "./align";
import { recordedSettleBack } from "./settle";
import { detectEngagement, parseRecordingCsv, type ParseReport } from "./parse";
import { RECORDING_MAX_BYTES, recordingInputSchema, type Channel } from "./schema";
import { z } from "zod";

export interface RecordingView {
  id: number;
  liftId: number;
  liftRevisionId: number;
  name: string;
  channels: Channel[];
  sampleCount: number;
  duration: number;
  engagementTime: number | null;
  mapping: Record<string, unknown>;
  fileUrl: string | null;
  createdAt: string;
}

function view(r: Recording): RecordingView {
  return {
    id: r.id,
    liftId: r.liftId,
    liftRevisionId: r.liftRevisionId,
    name: r.name,
    channels: r.channels as Channel[],
    sampleCount: r.sampleCount,
    duration: r.duration,
    engagementTime: r.engagementTime,
    mapping: r.mapping,
    fileUrl: r.uploadId ? `/api/uploads/${r.uploadId}` : null,
    createdAt: r.createdAt.toISOString(),
  };
}

export interface PreviewAnswer {
  ok: boolean;
  headers: string[];
  rowCount: number;
  channels: Channel[];
  engagementTime: number | null;
  /** The first rows as read, SI. */
  preview: ParseReport["samples"];
  /** Every n-th sample (at most PLOT_POINTS), SI, for the preview plot. */
  plot: ParseReport["samples"];
  units: ParseReport["units"];
  delimiter: string;
  decimalComma: boolean;
}

const PLOT_POINTS = 400;

/**
 * Checks (dry run) or stores a recording. Any problem → 400 listing every one (`issues`), nothing stored.
 */
export async function createRecording(actor: Actor, input: unknown): Promise<{ recording: RecordingView } | PreviewAnswer> {
  assertCan(actor, "recording:upload");
  const { Lift, Recording: RecordingModel, RecordingSample } = getModels();
  const liftId = (input as { liftId?: unknown } | null)?.liftId;
  const lift = typeof liftId === "number" && Number.isInteger(liftId) && liftId > 0 ? ownOr404(await Lift.findByPk(liftId), actor, "Lift") : null;
  const body = validate(recordingInputSchema, input);
  if (!lift) throw new Error("unreachable: liftId validated");
  const bytes = Buffer.byteLength(body.csv, "utf8");
  if (bytes > RECORDING_MAX_BYTES)
    throw new HttpError(413, `The file is ${bytes} bytes; at most ${RECORDING_MAX_BYTES}.`, [{ path: "csv", message: `at most ${RECORDING_MAX_BYTES} bytes` }]);
  const report = parseRecordingCsv(body.csv, body.mapping, body.units, body.columnUnits);
  if (report.issues.length) throw badRequest(`The file has ${report.issues.length} problem(s); nothing was stored.`, report.issues);
  const first = report.samples[0].t;
  const last = report.samples[report.samples.length - 1].t;
  if (body.engagementTime !== undefined && (body.engagementTime < first || body.engagementTime > last)) {
    throw badRequest("The engagement time is outside the recording; nothing was stored.", [
      { path: "engagementTime", message: `must be within the recording, ${first} s to ${last} s (got ${body.engagementTime} s)` },
    ]);
  }
  const engagementTime = body.engagementTime ?? detectEngagement(report.samples);
  if (body.dryRun)
    return {
      ok: true,
      headers: report.headers,
      rowCount: report.rowCount,
      channels: report.channels,
      engagementTime,
      preview: report.samples.slice(0, 20),
      plot: report.samples.filter((_, i) => i % Math.ceil(report.samples.length / PLOT_POINTS) === 0),
      units: report.units,
      delimiter: report.delimiter,
      decimalComma: report.decimalComma,
    };
  const revisionId = lift.currentRevisionId;
  if (!revisionId) throw new Error(`Lift ${lift.id} has no current revision.`);
  const upload = await storeRecordingFile(actor, lift.id, body.fileName ?? `${body.name}.csv`, Buffer.from(body.csv, "utf8"));
  const s = report.samples;
  // The file is stored first (object storage is not in the transaction): if the rows are refused, it goes too.
  const rec = await getSequelize()
    .transaction(async (transaction) => {
    const r = await RecordingModel.create(
      {
        organisationId: actor.organisationId,
        liftId: lift.id,
        liftRevisionId: revisionId,
        uploadId: upload.id,
        name: body.name,
        mapping: { columns: body.mapping, units: body.units, columnUnits: report.units, decimalComma: report.decimalComma },
        channels: report.channels,
        sampleCount: s.length,
        duration: s[s.length - 1].t - s[0].t,
        engagementTime,
        createdBy: actor.id,
      },
      { transaction },
    );
    for (let i = 0; i < s.length; i += 2000)
      await RecordingSample.bulkCreate(s.slice(i, i + 2000).map((x, k) => ({ recordingId: r.id, idx: i + k, ...x })), { transaction });
    await recordAudit({ transaction, actor, entity: "recording", entityId: r.id, action: "create", after: { name: r.name, liftId: r.liftId, samples: s.length } });
    return r;
  })
    .catch(async (err: unknown) => {
      await discardUpload(upload).catch((cleanup: unknown) => console.error("recording upload cleanup:", (cleanup as Error).message));
      throw err;
    });
  return { recording: view(rec) };
}

export async function listRecordings(actor: Actor, liftId: number): Promise<RecordingView[]> {
  assertCan(actor, "logbook:read");
  const { Lift, Recording: RecordingModel } = getModels();
  ownOr404(await Lift.findByPk(liftId), actor, "Lift");
  return (await RecordingModel.findAll({ where: { liftId }, order: [["id", "DESC"]] })).map(view);
}

async function ownRecording(actor: Actor, id: number): Promise<Recording> {
  assertCan(actor, "logbook:read");
  return ownOr404(await getModels().Recording.findByPk(id), actor, "Recording");
}

export interface RecordingSeries {
  t: number[];
  takeUpPosition: (number | null)[];
  chainTension: (number | null)[];
  driveCurrent: (number | null)[];
  trainPosition: (number | null)[];
  trainSpeed: (number | null)[];
}

async function seriesOf(id: number): Promise<RecordingSeries> {
  const rows = await getModels().RecordingSample.findAll({ where: { recordingId: id }, order: [["idx", "ASC"]], raw: true });
  return {
    t: rows.map((r) => r.t),
    takeUpPosition: rows.map((r) => r.takeUpPosition),
    chainTension: rows.map((r) => r.chainTension),
    driveCurrent: rows.map((r) => r.driveCurrent),
    trainPosition: rows.map((r) => r.trainPosition),
    trainSpeed: rows.map((r) => r.trainSpeed),
  };
}

export async function getRecording(actor: Actor, id: number): Promise<{ recording: RecordingView; series: RecordingSeries }> {
  const r = await ownRecording(actor, id);
  return { recording: view(r), series: await seriesOf(r.id) };
}

/** Everything a recording's page shows besides the recording's own plots. */
export interface RecordingPageView {
  recording: RecordingView;
  /** The recording's lift (its name, and its version for saving fitted values). */
  lift: { name: string; version: number } | null;
  /** The lift's scenarios in the organisation, by name. */
  scenarios: { id: number; name: string }[];
  /** The organisation's newest finished runs of this lift (any revision), for the overlay. */
  runs: RunPickerOption[];
  /** "Why the train settled back" from the recorded train speed; null without a train or a settle-back. */
  settleBack: SettleBackAccount | null;
}

/** A recording with its lift, the lift's scenarios and runs, and the recorded settle-back account (404 for another organisation's). */
export async function getRecordingPage(actor: Actor, id: number, units: UnitSystem): Promise<RecordingPageView> {
  const rec = await getRecording(actor, id);
  const { Lift, LiftRevision, Scenario, Train } = getModels();
  const liftId = rec.recording.liftId;
  const lift = await Lift.findByPk(liftId);
  const revisions = await LiftRevision.findAll({ where: { liftId }, attributes: ["id", "number"] });
  const scenarios = await Scenario.findAll({ where: { liftId, organisationId: actor.organisationId }, order: [["name", "ASC"]] });
  const runs = await runPickerOptions(actor, { units, liftRevisionIds: revisions.map((r) => r.id), limit: 50 });
  // The settle-back account needs the lift's design and a train: the first scenario's.
  const rev = await LiftRevision.findByPk(rec.recording.liftRevisionId);
  const train = scenarios[0] ? await Train.findByPk(scenarios[0].trainId) : null;
  const settleBack =
    rev && train
      ? recordedSettleBack(
          { t: rec.series.t, trainSpeed: rec.series.trainSpeed, trainPosition: rec.series.trainPosition, engagementTime: rec.recording.engagementTime },
          {
            lift: rev.geometry as { angle: number; chainFrom: number; chainTo: number },
            chain: rev.chain as { axialStiffness: number },
            drive: rev.drive as { speed: number },
            train: { cars: train.cars, carMass: train.carMassEmpty + train.seatsPerCar * train.riderMass, dogOffset: train.dogOffset, rollingResistance: train.rollingResistance, entrySpeed: 0 },
            gravity: STANDARD_GRAVITY,
          },
          units,
        )
      : null;
  return {
    recording: rec.recording,
    lift: lift ? { name: lift.name, version: lift.version } : null,
    scenarios: scenarios.map((s) => ({ id: s.id, name: s.name })),
    runs,
    settleBack,
  };
}

/** A done run of the same lift (any revision), of the actor's organisation. */
async function runOfLift(actor: Actor, runId: number, liftId: number) {
  const run = await findOwnRun(actor, runId);
  const rev = await getModels().LiftRevision.findByPk(run.liftRevisionId, { attributes: ["liftId"] });
  if (rev?.liftId !== liftId) throw badRequest("The run is of another lift.", [{ path: "runId", message: "choose a run of this recording's lift" }]);
  return run;
}

export async function overlay(actor: Actor, id: number, runIdText: unknown): Promise<OverlaySeries & { runId: number }> {
  const r = await ownRecording(actor, id);
  const runId = Number(runIdText);
  if (!Number.isInteger(runId) || runId <= 0) throw badRequest("Name the run to overlay.", [{ path: "runId", message: "a run id is required" }]);
  await runOfLift(actor, runId, r.liftId);
  const res = await getRunResult(actor, runId);
  const series = (res.result as { series: Record<string, number[]> }).series;
  const eng = (res.summary as { engagementTime?: number | null } | null)?.engagementTime ?? null;
  const s = await seriesOf(r.id);
  return { runId, ...alignAtEngagement({ t: s.t, takeUp: s.takeUpPosition, engagementTime: r.engagementTime }, { t: series.t, takeUp: series.takeUpPosition, engagementTime: eng }) };
}

export const saveCalibrationSchema = z.object({
  version: z.number().int().min(0),
  /** The calibration job whose fitted values become the revision (only its own values are saved). */
  calibrationId: z.number({ error: "name the fit to save (calibrationId)" }).int().positive(),
});

/**
 * Saves a finished fit's values as a new revision of the recording's lift (lib/lifts' revision function).
 * A fit that fails the quality gate (lib/calibration/gate.ts) can be read but not saved: 409 with the reasons.
 */
export async function saveCalibration(actor: Actor, id: number, input: unknown) {
  assertCan(actor, "calibration:save");
  const r = await ownRecording(actor, id);
  const body = validate(saveCalibrationSchema, input);
  const job = await getModels().Calibration.findByPk(body.calibrationId);
  if (!job || job.recordingId !== r.id || job.organisationId !== actor.organisationId)
    throw badRequest("That fit is not one of this recording's.", [{ path: "calibrationId", message: "choose a fit of this recording" }]);
  const view = toCalibrationView(job);
  if (view.status !== "done" || !view.result) throw new HttpError(409, "The fit has not finished; only a finished fit can be saved.");
  const verdict = fitVerdict(view.result);
  if (!verdict.acceptable)
    throw new HttpError(
      409,
      `This fit is not good enough to save as a lift revision: ${verdict.findings
        .filter((f) => !f.ok)
        .map((f) => f.text)
        .join(" ")}`,
    );
  const fitted = view.result.fitted;
  return updateLift(actor, r.liftId, {
    version: body.version,
    chain: { axialStiffness: fitted.axialStiffness, damping: fitted.damping, ...(view.fitFriction ? { guideFriction: fitted.guideFriction } : {}) },
    changeSummary: `Calibrated against recording "${r.name}" (#${r.id}), fit #${job.id}`,
  });
}
