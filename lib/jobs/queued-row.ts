/**
 * The row behind a queued job: handing it to the Redis queue, and a queue worker taking it. Knows no domain:
 * the caller names its kind of job and passes its model, whose rows need only `status` ("queued", "running",
 * …) and `runner` (which process holds the job).
 */
import { Op } from "sequelize";
import { jobMode, QUEUE_RUNNER } from "./dispatch";
import type { QueuedJobData } from "./bullmq";
import type { Slot } from "./pool";
import { RUNNER_ID, runnerMayBeAlive } from "./runner-id";

/** What a job's table must offer (any Sequelize model with `status` and `runner` columns). */
export interface JobRowModel {
  findByPk(id: number, options: { attributes: string[] }): Promise<{ status: string; runner?: string | null } | null>;
  update(values: { runner: string }, options: { where: Record<string, unknown> }): Promise<[affectedCount: number]>;
}

/**
 * Hands an accepted job to its executor. Pool mode: `runHere` runs it in this process (resolves when its row
 * is final). Queue mode: releases the local place, marks the row as waiting in the queue and adds the job
 * (resolves once it is queued; a worker finishes it).
 */
export async function dispatchJob(job: {
  name: string;
  id: number;
  rows: JobRowModel;
  data: QueuedJobData;
  slot: Slot;
  runHere: () => Promise<void>;
}): Promise<void> {
  if (jobMode() === "pool") return job.runHere();
  job.slot.release();
  await job.rows.update({ runner: QUEUE_RUNNER }, { where: { id: job.id } });
  const { enqueueJob } = await import("./bullmq");
  await enqueueJob(job.name, job.id, job.data);
}

/**
 * A queue worker takes a job's row: true when the row still waits in the queue (or its runner died while
 * running it) and this process's runner id is now on it; false when it was cancelled, finished or taken.
 */
export async function takeQueuedRow(rows: JobRowModel, id: number): Promise<boolean> {
  const before = await rows.findByPk(id, { attributes: ["id", "status", "runner"] });
  if (!before) return false;
  const runner = before.runner ?? null;
  const takeOver = before.status === "running" && runner !== QUEUE_RUNNER && !runnerMayBeAlive(runner);
  if (before.status !== "queued" && !takeOver) return false;
  const [taken] = await rows.update({ runner: RUNNER_ID }, { where: { id, status: before.status, runner: runner ?? { [Op.is]: null } } });
  return taken > 0;
}
