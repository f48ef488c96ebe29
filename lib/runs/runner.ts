import { Op } from "sequelize";
import { getModels } from "@/models";
import type { Run } from "@/models/Run";
import { getJobPool, type Slot } from "@/lib/jobs/pool";
import { isDbConnectionError } from "@/lib/db/health";
import type { SimulationOutcome, WorkerMessage } from "@/lib/jobs/protocol";
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

/** How long a finished run keeps trying to store its outcome while the database is unreachable. */
const FINAL_WRITE_RETRY_MS = 5 * 60_000;

/**
 * The outcome exists only in this process's memory: when the database is briefly gone (restarting,
 * failing over) keep trying instead of leaving the run queued/running for good. Other errors throw.
 */
async function persistFinal(write: () => Promise<unknown>): Promise<void> {
  const deadline = Date.now() + FINAL_WRITE_RETRY_MS;
  for (let wait = 250; ; wait = Math.min(wait * 2, 5_000)) {
    try {
      await write();
      return;
    } catch (err) {
      if (!isDbConnectionError(err) || Date.now() > deadline) throw err;
      await new Promise((r) => setTimeout(r, wait));
    }
  }
}

/**
 * Runs a queued run in the job pool and records every step: running (when a worker picks it up),
 * progress (throttled), then done / failed / cancelled. Resolves when the run's row is final.
 * The slot was reserved when the run was accepted; it is released here.
 */
export function dispatchRun(run: Pick<Run, "id" | "inputs">, solver: SolverSettings, slot: Slot): Promise<void> {
  const jobs = activeJobs();
  const controller = new AbortController();
  const cfg = runConfig();
  let writes: Promise<unknown> = Promise.resolve();
  const queueWrite = (fn: () => Promise<unknown>) => {
    writes = writes.then(fn).catch((err) => console.error(`run ${run.id}: progress write failed`, err));
  };
  let lastProgressWrite = 0;
  let budgetTimer: NodeJS.Timeout | undefined;

  const onMessage = (m: WorkerMessage) => {
    if (m.type === "started") {
      queueWrite(() => updateActive(run.id, { status: "running", startedAt: new Date() }, ["queued"]));
      // The engine keeps its own budget; this guard stops the thread if the engine overruns it anyway.
      budgetTimer = setTimeout(() => controller.abort("budget" satisfies AbortReason), solver.budgetSeconds * 1000 + cfg.budgetGraceMs);
    } else if (m.type === "progress") {
      const now = Date.now();
      if (now - lastProgressWrite < cfg.progressWriteMs) return;
      lastProgressWrite = now;
      queueWrite(() => updateActive(run.id, { progress: m.value }, ["running"]));
    }
  };

  const done = (async () => {
    try {
      const outcome = await getJobPool().simulate(
        { runId: run.id, scenario: run.inputs, frameBudget: solver.frameBudget, budgetMs: solver.budgetSeconds * 1000 },
        { signal: controller.signal, onMessage },
      );
      await writes;
      await persistFinal(() => storeOutcome(run.id, outcome));
    } catch (err) {
      await writes;
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
      if (budgetTimer) clearTimeout(budgetTimer);
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
