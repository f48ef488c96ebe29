/**
 * A calibration fit as a job: fitted in the in-process pool, or queued in Redis and taken by a queue
 * worker (lib/jobs/bullmq.ts calls `calibrationQueueJob` for jobs named "calibration").
 */
import { Op } from "sequelize";
import { getModels } from "@/models";
import type { Slot } from "@/lib/jobs/pool";
import { jobMode, QUEUE_RUNNER } from "@/lib/jobs/dispatch";
import type { QueueJobContext, QueuedJobData } from "@/lib/jobs/bullmq";
import { RUNNER_ID, runnerMayBeAlive } from "@/lib/jobs/runner-id";
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
  if (jobMode() === "pool") return dispatchCalibration(cal, slot);
  slot.release();
  const { Calibration } = getModels();
  await Calibration.update({ runner: QUEUE_RUNNER }, { where: { id: cal.id } });
  const { enqueueJob } = await import("@/lib/jobs/bullmq");
  const data: CalibrationJobData = { calibrationId: cal.id, organisationId: cal.organisationId };
  await enqueueJob(CALIBRATION_JOB, cal.id, data);
}

/** Takes the calibration (if it still waits, or its worker died) and fits it in the local pool. */
export async function calibrationQueueJob(job: QueuedJobData, ctx: QueueJobContext): Promise<void> {
  const data = job as CalibrationJobData;
  const { Calibration } = getModels();
  const before = await Calibration.findByPk(data.calibrationId, { attributes: ["id", "status", "runner"] });
  if (!before) return;
  const takeOver = before.status === "running" && before.runner !== QUEUE_RUNNER && !runnerMayBeAlive(before.runner);
  if (before.status !== "queued" && !takeOver) return;
  const [taken] = await Calibration.update(
    { runner: RUNNER_ID },
    { where: { id: data.calibrationId, status: before.status, runner: before.runner ?? { [Op.is]: null } } },
  );
  if (!taken) return;
  const cal = await Calibration.scope("withInputs").findByPk(data.calibrationId);
  if (!cal) return;
  await dispatchCalibration(cal, await ctx.localSlot());
}
