/**
 * A calibration fit as a job: fitted in the in-process pool, or queued in Redis and taken by a queue
 * worker (lib/jobs/bullmq.ts calls `calibrationQueueJob` for jobs named "calibration").
 */
import { getModels } from "@/models";
import type { Slot } from "@/lib/jobs/pool";
import type { QueueJobContext, QueuedJobData } from "@/lib/jobs/bullmq";
import { dispatchJob, takeQueuedRow } from "@/lib/jobs/queued-row";
import { dispatchCalibration } from "./runner";

export const CALIBRATION_JOB = "calibration";

/** A calibration job: the row holds the fit's inputs. */
export interface CalibrationJobData extends QueuedJobData {
  calibrationId: number;
}

/**
 * Hands an accepted calibration to its executor: pool mode fits it here (resolves when its row is final);
 * queue mode marks it as waiting in Redis and adds the job for a worker.
 */
export async function dispatchCalibrationJob(
  cal: { id: number; organisationId: number; inputs: Record<string, unknown> },
  slot: Slot,
): Promise<void> {
  const data: CalibrationJobData = { calibrationId: cal.id, organisationId: cal.organisationId };
  await dispatchJob({ name: CALIBRATION_JOB, id: cal.id, rows: getModels().Calibration, data, slot, runHere: () => dispatchCalibration(cal, slot) });
}

/** Takes the calibration (if it still waits, or its worker died) and fits it in the local pool. */
export async function calibrationQueueJob(job: QueuedJobData, ctx: QueueJobContext): Promise<void> {
  const data = job as CalibrationJobData;
  const { Calibration } = getModels();
  if (!(await takeQueuedRow(Calibration, data.calibrationId))) return;
  const cal = await Calibration.scope("withInputs").findByPk(data.calibrationId);
  if (!cal) return;
  await dispatchCalibration(cal, await ctx.localSlot());
}
