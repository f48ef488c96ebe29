/**
 * What the main thread does for every job it hands to the pool (runs, calibration fits): write its row's
 * steps in order, throttle progress writes, stop the thread when it overruns its wall-time budget, and keep
 * trying to store the outcome while the database is briefly away.
 */
import { isDbConnectionError } from "@/lib/db/health";
import type { WorkerMessage } from "./protocol";

/** How long a finished job keeps trying to store its outcome while the database is unreachable. */
const FINAL_WRITE_RETRY_MS = 5 * 60_000;

/**
 * The outcome exists only in this process's memory: when the database is briefly gone (restarting,
 * failing over) keep trying instead of leaving the row queued/running for good. Other errors throw.
 */
export async function persistFinal(write: () => Promise<unknown>): Promise<void> {
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

export interface JobTrackingOptions {
  /** For log lines, e.g. "run 12". */
  label: string;
  /** Wall-time guard, counted from the moment a worker starts the job. */
  budgetMs: number;
  progressWriteMs: number;
  markRunning: () => Promise<unknown>;
  writeProgress: (fraction: number) => Promise<unknown>;
}

export interface JobTracking {
  /** Aborted with "budget" when the job overruns; callers may abort it for reasons of their own. */
  controller: AbortController;
  /** Pass to the pool: turns the worker's messages into row writes. */
  onMessage: (m: WorkerMessage) => void;
  /** Resolves once every step written so far is stored (or has failed and been logged). */
  written: () => Promise<unknown>;
  /** Clears the budget timer. */
  stop: () => void;
}

export function trackJob(o: JobTrackingOptions): JobTracking {
  const controller = new AbortController();
  // Writes go one after another, so a late progress write never lands after the running mark it follows.
  let writes: Promise<unknown> = Promise.resolve();
  const queueWrite = (fn: () => Promise<unknown>) => {
    writes = writes.then(fn).catch((err) => console.error(`${o.label}: progress write failed`, err));
  };
  let lastProgressWrite = 0;
  let budgetTimer: NodeJS.Timeout | undefined;
  const onMessage = (m: WorkerMessage) => {
    if (m.type === "started") {
      queueWrite(o.markRunning);
      budgetTimer = setTimeout(() => controller.abort("budget"), o.budgetMs);
    } else if (m.type === "progress") {
      const now = Date.now();
      if (now - lastProgressWrite < o.progressWriteMs) return;
      lastProgressWrite = now;
      queueWrite(() => o.writeProgress(m.value));
    }
  };
  return {
    controller,
    onMessage,
    written: () => writes,
    stop: () => {
      if (budgetTimer) clearTimeout(budgetTimer);
    },
  };
}
