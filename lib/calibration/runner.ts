/**
 * Runs a calibration job in the job pool and records every step on its row, as lib/runs/runner.ts does
 * for runs: running (when a worker thread picks it up), progress (throttled), then done or failed.
 */
import { Op } from "sequelize";
import { getModels } from "@/models";
import type { Calibration } from "@/models/Calibration";
import { getJobPool, type Slot } from "@/lib/jobs/pool";
import type { CalibrationOutcome, CalibrationTask } from "@/lib/engine/protocol";
import { persistFinal, trackJob } from "@/lib/jobs/tracking";
import { ACTIVE_CALIBRATION_STATUSES, type CalibrationStatus } from "./status";

/** Wall-time guard of one fit (CALIBRATION_BUDGET_SECONDS, default 120 s; a fit takes a few seconds). */
export function calibrationBudgetSeconds(env: NodeJS.ProcessEnv = process.env): number {
  const n = Number(env.CALIBRATION_BUDGET_SECONDS);
  return Number.isFinite(n) && n > 0 ? n : 120;
}

/** Progress is written at most this often (the worker already throttles its messages). */
const PROGRESS_WRITE_MS = 250;

const state = globalThis as unknown as { tautlineCalibrationJobs?: Map<number, Promise<void>> };
function activeJobs(): Map<number, Promise<void>> {
  if (!state.tautlineCalibrationJobs) state.tautlineCalibrationJobs = new Map();
  return state.tautlineCalibrationJobs;
}

/** Updates a calibration only while it is still queued or running (recovery may have failed it). */
async function updateActive(id: number, values: Partial<Record<keyof Calibration, unknown>>, from: readonly CalibrationStatus[] = ACTIVE_CALIBRATION_STATUSES) {
  const { Calibration } = getModels();
  const [count] = await Calibration.update(values as never, { where: { id, status: { [Op.in]: [...from] } } });
  return count;
}

function storeOutcome(id: number, outcome: CalibrationOutcome) {
  const finishedAt = new Date();
  if (!outcome.ok) {
    return updateActive(id, { status: "failed", error: outcome.message, errorCode: outcome.code, wallTimeMs: outcome.wallTimeMs, finishedAt });
  }
  // JSON has no NaN or Infinity: a figure the fit could not form is stored as null (the panel shows a dash).
  const result = JSON.parse(JSON.stringify(outcome.result)) as Record<string, unknown>;
  return updateActive(id, { status: "done", progress: 1, result, wallTimeMs: outcome.wallTimeMs, finishedAt });
}

export type CalibrationInputs = Pick<CalibrationTask, "scenario" | "trace" | "options">;

/**
 * Runs the calibration in a worker thread; resolves when its row is final. The slot was reserved when the
 * job was accepted; it is released here.
 */
export function dispatchCalibration(cal: { id: number; inputs: Record<string, unknown> }, slot: Slot): Promise<void> {
  const jobs = activeJobs();
  const budgetSeconds = calibrationBudgetSeconds();
  const tracking = trackJob({
    label: `calibration ${cal.id}`,
    budgetMs: budgetSeconds * 1000,
    progressWriteMs: PROGRESS_WRITE_MS,
    markRunning: () => updateActive(cal.id, { status: "running", startedAt: new Date() }, ["queued"]),
    writeProgress: (value) => updateActive(cal.id, { progress: value }, ["running"]),
  });
  const { controller, onMessage } = tracking;

  const inputs = (typeof cal.inputs === "string" ? JSON.parse(cal.inputs) : cal.inputs) as CalibrationInputs;
  const done = (async () => {
    try {
      const outcome = await getJobPool().run<CalibrationOutcome, CalibrationTask>({ kind: "calibration", calibrationId: cal.id, ...inputs }, { organisationId: slot.organisationId, signal: controller.signal, onMessage });
      await tracking.written();
      await persistFinal(() => storeOutcome(cal.id, outcome));
    } catch (err) {
      await tracking.written();
      const budget = controller.signal.aborted;
      if (!budget) console.error(`calibration ${cal.id}: job failed`, err);
      const message = budget
        ? `The fit exceeded its time budget of ${budgetSeconds} s and was stopped.`
        : `The calibration's worker stopped unexpectedly: ${err instanceof Error ? err.message : String(err)}`;
      await persistFinal(() => updateActive(cal.id, { status: "failed", error: message, errorCode: budget ? "budget" : "worker-error", finishedAt: new Date() }));
    } finally {
      tracking.stop();
      slot.release();
      jobs.delete(cal.id);
    }
  })().catch((err) => console.error(`calibration ${cal.id}: could not record the outcome`, err));

  jobs.set(cal.id, done);
  return done;
}

/** Resolves when this process has finished the calibration's job (immediately if it has none). For tests. */
export async function waitForCalibrationJob(id: number): Promise<void> {
  await activeJobs().get(id);
}
