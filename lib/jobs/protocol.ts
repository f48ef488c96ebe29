import type { MessagePort } from "node:worker_threads";

/** What the main thread sends to a worker thread for one run. */
export interface SimulationTask {
  runId: number;
  /** A validated engine scenario (the run's stored inputs). */
  scenario: unknown;
  frameBudget?: number;
  /** The engine's budget (wall time in ms) for this run. */
  budgetMs?: number;
  /** Messages back to the main thread while the task runs. */
  port: MessagePort;
}

/** Messages a worker posts on the task's port. */
export type WorkerMessage = { type: "started" } | { type: "progress"; value: number };

/** The worker's answer. Engine failures come back as values: thrown errors lose their fields across threads. */
export type SimulationOutcome =
  | {
      ok: true;
      summary: Record<string, unknown>;
      diagnostics: Record<string, unknown>;
      /** gzipped tautline-result/1 container (lib/runs/result-format.ts). */
      blob: Uint8Array;
      wallTimeMs: number;
    }
  | {
      ok: false;
      code: string;
      message: string;
      diagnostics?: Record<string, unknown>;
      wallTimeMs: number;
    };
