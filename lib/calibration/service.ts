/**
 * Calibration jobs of a recording: start (validate, hold a place in the job pool — 503 when full, nothing
 * stored — store the job as queued, hand it to the pool or the Redis queue, answer at once) and read
 * (status, progress, the fit once done). The fit itself runs in a worker thread (lib/engine/worker.ts).
 */
import type { Scenario as EngineScenario } from "@/sim";
import { assertCan, ownOr404, type Actor } from "@/lib/http/actor";
import { validate } from "@/lib/http/validate";
import { badRequest, HttpError, notFound, unavailable } from "@/lib/http/errors";
import { getJobPool, QueueFullError, type Slot } from "@/lib/jobs/pool";
import { dispatchCalibrationJob } from "./queue";
import { RUNNER_ID } from "@/lib/jobs/runner-id";
import { resolveEngineScenario } from "@/lib/scenarios/engine";
import { loadFollowerTrains } from "@/lib/scenarios/service";
import { getModels, type Calibration, type Recording } from "@/models";
import type { CalibrationResult, RecordedTrace } from "./fit";
import type { CalibrationInputs } from "./runner";
import { calibrateInputSchema } from "./schema";
import type { CalibrationStatus } from "./status";

export interface CalibrationView {
  id: number;
  recordingId: number;
  scenarioId: number;
  scenario: string;
  fitFriction: boolean;
  status: CalibrationStatus;
  /** Share of the fit's engine runs done, 0–1. */
  progress: number;
  /** The fit once done (figures the fit could not form are null). */
  result: CalibrationResult | null;
  error: string | null;
  errorCode: string | null;
  wallTimeMs: number | null;
  queuedAt: string;
  startedAt: string | null;
  finishedAt: string | null;
}

const parsed = <T>(v: unknown): T => (typeof v === "string" ? JSON.parse(v) : v) as T;

export function toCalibrationView(c: Calibration): CalibrationView {
  const options = parsed<{ fitFriction?: boolean; scenarioName?: string }>(c.options);
  return {
    id: c.id,
    recordingId: c.recordingId,
    scenarioId: c.scenarioId,
    scenario: options.scenarioName ?? "",
    fitFriction: options.fitFriction ?? false,
    status: c.status,
    progress: c.progress,
    result: c.result ? parsed<CalibrationResult>(c.result) : null,
    error: c.error ?? null,
    errorCode: c.errorCode ?? null,
    wallTimeMs: c.wallTimeMs ?? null,
    queuedAt: c.queuedAt.toISOString(),
    startedAt: c.startedAt?.toISOString() ?? null,
    finishedAt: c.finishedAt?.toISOString() ?? null,
  };
}

async function ownRecording(actor: Actor, id: number): Promise<Recording> {
  assertCan(actor, "logbook:read");
  return ownOr404(await getModels().Recording.findByPk(id), actor, "Recording");
}

/** The recording's take-up trace on its own clock from 0, and its engagement time on that clock. */
async function recordedTrace(r: Recording): Promise<RecordedTrace> {
  const rows = await getModels().RecordingSample.findAll({
    where: { recordingId: r.id },
    attributes: ["t", "takeUpPosition"],
    order: [["idx", "ASC"]],
    raw: true,
  });
  const t0 = rows.length ? rows[0].t : 0;
  const t: number[] = [];
  const takeUp: number[] = [];
  for (const row of rows) {
    if (row.takeUpPosition === null) continue;
    t.push(row.t - t0);
    takeUp.push(row.takeUpPosition);
  }
  if (t.length < 10) throw badRequest("The recording has no take-up trace to fit.", [{ path: "recording", message: "map a take-up position column" }]);
  if (r.engagementTime === null)
    throw badRequest("The recording has no engagement time to align on.", [{ path: "engagementTime", message: "give the engagement time or a train speed column" }]);
  return { t, takeUp, engagementTime: r.engagementTime - t0 };
}

function reserveSlot(organisationId: number): Slot {
  try {
    return getJobPool().reserve(organisationId);
  } catch (err) {
    if (err instanceof QueueFullError) throw unavailable("Every engine worker is busy and the queue is full; try the fit again shortly.", err.retryAfterSeconds);
    throw err;
  }
}

/**
 * Starts fitting E·A and damping (and optionally guide friction) to the recording's take-up trace, with the
 * scenario's train and entry conditions on the recording's lift revision. Answers the queued job at once.
 */
export async function startCalibration(actor: Actor, recordingId: number, input: unknown): Promise<CalibrationView> {
  const r = await ownRecording(actor, recordingId);
  assertCan(actor, "run:start");
  const body = validate(calibrateInputSchema, input);
  const { Scenario, Train, LiftRevision, Calibration } = getModels();
  const scenario = ownOr404(await Scenario.findByPk(body.scenarioId), actor, "Scenario");
  if (scenario.liftId !== r.liftId) throw badRequest("The scenario is of another lift.", [{ path: "scenarioId", message: "choose a scenario of this recording's lift" }]);
  const [train, revision] = await Promise.all([Train.findByPk(scenario.trainId), LiftRevision.findByPk(r.liftRevisionId)]);
  if (!train || !revision) throw new HttpError(409, "The scenario's train or the recording's revision is missing.");
  const resolved = resolveEngineScenario(scenario, revision, train, await loadFollowerTrains(scenario));
  if (!resolved.ok) throw badRequest("The scenario does not make a valid engine scenario with the recording's revision.", resolved.issues);
  const trace = await recordedTrace(r);
  const fitFriction = body.fitFriction ?? false;
  const inputs: CalibrationInputs = { scenario: resolved.scenario as EngineScenario, trace, options: { fitFriction } };
  const slot = reserveSlot(actor.organisationId);
  let row: Calibration;
  try {
    row = await Calibration.create({
      organisationId: actor.organisationId,
      recordingId: r.id,
      scenarioId: scenario.id,
      startedBy: actor.id,
      options: { fitFriction, scenarioName: scenario.name },
      inputs: inputs as unknown as Record<string, unknown>,
      runner: RUNNER_ID,
      queuedAt: new Date(),
    });
  } catch (err) {
    slot.release();
    throw err;
  }
  // Pool by default; BullMQ on Redis when REDIS_URL is set (lib/jobs/dispatch.ts).
  void dispatchCalibrationJob(row, slot).catch((err) => console.error(`calibration ${row.id}: could not queue`, err));
  return toCalibrationView(row);
}

/** One calibration of the recording (404 for another recording's or organisation's). */
export async function getCalibration(actor: Actor, recordingId: number, calibrationId: number): Promise<CalibrationView> {
  const r = await ownRecording(actor, recordingId);
  const c = await getModels().Calibration.findByPk(calibrationId);
  if (!c || c.recordingId !== r.id || c.organisationId !== actor.organisationId) throw notFound("Calibration not found.");
  return toCalibrationView(c);
}

/** The recording's latest calibration, or null when it has none. */
export async function latestCalibration(actor: Actor, recordingId: number): Promise<CalibrationView | null> {
  const r = await ownRecording(actor, recordingId);
  const c = await getModels().Calibration.findOne({ where: { recordingId: r.id, organisationId: actor.organisationId }, order: [["id", "DESC"]] });
  return c ? toCalibrationView(c) : null;
}
