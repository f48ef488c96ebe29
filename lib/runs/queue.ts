/**
 * A run as a job: handed to the in-process pool, or queued in Redis and taken by a queue worker
 * (lib/jobs/bullmq.ts calls `runQueueJob` for jobs named "run").
 */
import { getModels } from "@/models";
import type { Run } from "@/models/Run";
import type { Slot } from "@/lib/jobs/pool";
import { jobMode } from "@/lib/jobs/dispatch";
import type { QueueJobContext, QueuedJobData } from "@/lib/jobs/bullmq";
import { dispatchJob, takeQueuedRow } from "@/lib/jobs/queued-row";
import { abortRun, dispatchRun, type SolverSettings } from "./runner";

export const RUN_JOB = "run";

export interface RunJobData extends QueuedJobData {
  runId: number;
  solver: SolverSettings;
  studyCaseId?: number;
}

/** How often a queue worker checks whether the run it runs was cancelled. */
const CANCEL_POLL_MS = 400;

/**
 * Hands an accepted run to its executor. Pool mode: runs it here (resolves when the row is final).
 * Queue mode: releases the local place, marks the row as waiting in the queue and adds the job
 * (resolves once it is queued; a worker finishes it).
 */
export async function dispatchRunJob(
  run: Pick<Run, "id" | "inputs" | "organisationId">,
  solver: SolverSettings,
  slot: Slot,
  extra: { studyCaseId?: number } = {},
): Promise<void> {
  const data: RunJobData = { runId: run.id, organisationId: run.organisationId, solver, ...extra };
  await dispatchJob({ name: RUN_JOB, id: run.id, rows: getModels().Run, data, slot, runHere: () => dispatchRun(run, solver, slot) });
}

/** Drops a cancelled run's job from the Redis queue if it still waits there. */
export async function removeQueuedRun(run: Pick<Run, "id" | "organisationId">): Promise<void> {
  if (jobMode() !== "queue") return;
  const { removeQueuedJob } = await import("@/lib/jobs/bullmq");
  await removeQueuedJob(RUN_JOB, run.id, run.organisationId);
}

/** Takes the run (if it still waits), runs it in the local pool, and stops it when its row is cancelled. */
export async function runQueueJob(job: QueuedJobData, ctx: QueueJobContext): Promise<void> {
  const data = job as RunJobData;
  const { Run } = getModels();
  // A job whose run was cancelled or finished meanwhile is dropped; a run whose worker died is taken over.
  if (!(await takeQueuedRow(Run, data.runId))) return;
  const run = await Run.findByPk(data.runId);
  if (!run) return;
  const done = dispatchRun(run, data.solver, await ctx.localSlot());
  const poll = setInterval(() => {
    void Run.findByPk(data.runId, { attributes: ["id", "status"] }).then((r) => {
      if (!r || r.status === "cancelled") void abortRun(data.runId);
    });
  }, CANCEL_POLL_MS);
  try {
    await done;
  } finally {
    clearInterval(poll);
  }
}
