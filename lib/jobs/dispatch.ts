/**
 * Where a run's (or a calibration's) job goes: the in-process worker-thread pool (default), or BullMQ on Redis when REDIS_URL
 * is set (workers started with `npm run worker`, on any machine that reaches the database and Redis).
 */
import { getModels } from "@/models";
import type { Run } from "@/models/Run";
import { dispatchRun, type SolverSettings } from "@/lib/runs/runner";
import { dispatchCalibration } from "@/lib/calibration/runner";
import type { Slot } from "./pool";
import { jobConfig } from "./config";

export type JobMode = "pool" | "queue";

export function jobMode(env: NodeJS.ProcessEnv = process.env): JobMode {
  return env.REDIS_URL ? "queue" : "pool";
}

/**
 * The runner id of a run waiting in the Redis queue. Its host part is not this machine's name, so the
 * restart recovery (lib/runs/recover.ts) leaves it alone: the job survives a server restart in Redis.
 * A worker that takes the job writes its own runner id.
 */
export const QUEUE_RUNNER = "redis-queue:0:0";

/** Most jobs of one organisation running at once (JOB_ORG_CONCURRENCY, default 2), in both modes. */
export function orgConcurrency(env: NodeJS.ProcessEnv = process.env): number {
  return jobConfig(env).orgConcurrency;
}

/**
 * Hands an accepted run to its executor. Pool mode: runs it here (resolves when the row is final).
 * Queue mode: releases the local place, marks the row as waiting in the queue and adds the job
 * (resolves once it is queued; a worker finishes it).
 */
export async function dispatchJob(
  run: Pick<Run, "id" | "inputs" | "organisationId">,
  solver: SolverSettings,
  slot: Slot,
  extra: { studyCaseId?: number } = {},
): Promise<void> {
  if (jobMode() === "pool") return dispatchRun(run, solver, slot);
  slot.release();
  const { Run } = getModels();
  await Run.update({ runner: QUEUE_RUNNER }, { where: { id: run.id } });
  const { enqueueRun } = await import("./bullmq");
  await enqueueRun({ runId: run.id, organisationId: run.organisationId, solver, ...extra });
}

/**
 * Hands an accepted calibration to its executor, like dispatchJob: pool mode fits it here (resolves when
 * its row is final); queue mode marks it as waiting in Redis and adds the job for a worker.
 */
export async function dispatchCalibrationJob(
  cal: { id: number; organisationId: number; inputs: Record<string, unknown> },
  slot: Slot,
): Promise<void> {
  if (jobMode() === "pool") return dispatchCalibration(cal, slot);
  slot.release();
  const { Calibration } = getModels();
  await Calibration.update({ runner: QUEUE_RUNNER }, { where: { id: cal.id } });
  const { enqueueCalibration } = await import("./bullmq");
  await enqueueCalibration({ calibrationId: cal.id, organisationId: cal.organisationId });
}
