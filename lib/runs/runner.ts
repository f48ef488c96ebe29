import { Op } from "sequelize";
import { getModels } from "@/models";
import type { Run } from "@/models/Run";
import { getJobPool, type Slot } from "@/lib/jobs/pool";
import type { SimulationOutcome, SimulationTask } from "@/lib/engine/protocol";
import { persistFinal, trackJob } from "@/lib/jobs/tracking";
import { runConfig } from "./config";
import { ACTIVE_RUN_STATUSES, type RunStatus } from "./status";
import { RESULT_FORMAT } from "./result-format";

/** Why a job was aborted from the main thread. */
type AbortReason = "cancel" | "budget";

interface ActiveJob {
  controller: AbortController;
  done: Promise<void>;
}

const state = globalThis as unknown as { tautlineActiveJobs?: Map<number, ActiveJob> };
function activeJobs(): Map<number, ActiveJob> {
  if (!state.tautlineActiveJobs) state.tautlineActiveJobs = new Map();
  return state.tautlineActiveJobs;
}

export interface SolverSettings {
  frameBudget?: number;
  budgetSeconds: number;
}

const MIB = 1024 * 1024;

/** Updates a run only while it is still queued or running: a cancel that got there first wins. */
async function updateActive(
  runId: number,
  values: Partial<Record<keyof Run, unknown>>,
  from: readonly RunStatus[] = ACTIVE_RUN_STATUSES,
) {
  const { Run } = getModels();
  const [count] = await Run.update(
    { ...values, version: Run.sequelize!.literal("version + 1") } as never,
    { where: { id: runId, status: { [Op.in]: [...from] } } },
  );
  return count;
}

export function describeBytes(n: number): string {
  return n >= MIB ? `${(n / MIB).toFixed(1)} MiB` : `${Math.ceil(n / 1024)} KiB`;
}

async function storeOutcome(runId: number, outcome: SimulationOutcome): Promise<void> {
  const finishedAt = new Date();
  if (!outcome.ok) {
    await updateActive(runId, {
      status: "failed",
      error: outcome.message,
      errorCode: outcome.code,
      diagnostics: outcome.diagnostics ?? null,
      wallTimeMs: outcome.wallTimeMs,
      finishedAt,
    });
    return;
  }
  const limit = runConfig().resultMaxBytes;
  if (outcome.blob.byteLength > limit) {
    await updateActive(runId, {
      status: "failed",
      error:
        `The result is ${describeBytes(outcome.blob.byteLength)} after compression, more than the ` +
        `${describeBytes(limit)} a run may store. Lower the frame budget, the number of segments or the duration.`,
      errorCode: "result-too-large",
      summary: outcome.summary,
      diagnostics: outcome.diagnostics,
      wallTimeMs: outcome.wallTimeMs,
      finishedAt,
    });
    return;
  }
  await updateActive(runId, {
    status: "done",
    progress: 1,
    summary: outcome.summary,
    diagnostics: outcome.diagnostics,
    result: Buffer.from(outcome.blob.buffer, outcome.blob.byteOffset, outcome.blob.byteLength),
    resultFormat: RESULT_FORMAT,
    resultBytes: outcome.blob.byteLength,
    wallTimeMs: outcome.wallTimeMs,
    finishedAt,
  });
}

/**
 * Runs a queued run in the job pool and records every step: running (when a worker picks it up),
 * progress (throttled), then done / failed / cancelled. Resolves when the run's row is final.
 * The slot was reserved when the run was accepted; it is released here.
 */
export function dispatchRun(run: Pick<Run, "id" | "inputs">, solver: SolverSettings, slot: Slot): Promise<void> {
  const jobs = activeJobs();
  const cfg = runConfig();
  // The engine keeps its own budget; the tracker's guard stops the thread if the engine overruns it anyway.
  const tracking = trackJob({
    label: `run ${run.id}`,
    budgetMs: solver.budgetSeconds * 1000 + cfg.budgetGraceMs,
    progressWriteMs: cfg.progressWriteMs,
    markRunning: () => updateActive(run.id, { status: "running", startedAt: new Date() }, ["queued"]),
    writeProgress: (value) => updateActive(run.id, { progress: value }, ["running"]),
  });
  const { controller, onMessage } = tracking;

  const done = (async () => {
    try {
      const outcome = await getJobPool().run<SimulationOutcome, SimulationTask>(
        { runId: run.id, scenario: run.inputs, frameBudget: solver.frameBudget, budgetMs: solver.budgetSeconds * 1000 },
        { organisationId: slot.organisationId, signal: controller.signal, onMessage },
      );
      await tracking.written();
      await persistFinal(() => storeOutcome(run.id, outcome));
    } catch (err) {
      await tracking.written();
      const reason = controller.signal.aborted ? (controller.signal.reason as AbortReason) : null;
      if (reason === "cancel") {
        await persistFinal(() => updateActive(run.id, { status: "cancelled", finishedAt: new Date() }));
      } else if (reason === "budget") {
        await persistFinal(() =>
          updateActive(run.id, {
            status: "failed",
            error: `The run exceeded its time budget of ${solver.budgetSeconds} s and was stopped.`,
            errorCode: "budget",
            finishedAt: new Date(),
          }),
        );
      } else {
        const message = err instanceof Error ? err.message : String(err);
        console.error(`run ${run.id}: job failed`, err);
        await persistFinal(() =>
          updateActive(run.id, {
            status: "failed",
            error: `The run's worker stopped unexpectedly: ${message}`,
            errorCode: "worker-error",
            finishedAt: new Date(),
          }),
        );
      }
    } finally {
      tracking.stop();
      slot.release();
      jobs.delete(run.id);
    }
  })().catch((err) => console.error(`run ${run.id}: could not record the outcome`, err));

  jobs.set(run.id, { controller, done });
  return done;
}

/** Aborts a run's job if this process runs it; resolves once its row is final. False if not found here. */
export async function abortRun(runId: number): Promise<boolean> {
  const job = activeJobs().get(runId);
  if (!job) return false;
  job.controller.abort("cancel" satisfies AbortReason);
  await job.done;
  return true;
}

/** Resolves when this process has finished the run's job (immediately if it has none). For tests and the seed. */
export async function waitForJob(runId: number): Promise<void> {
  await activeJobs().get(runId)?.done;
}

export function hasActiveJob(runId: number): boolean {
  return activeJobs().has(runId);
}
