/** The engine worker thread's tasks and answers (lib/engine/worker.ts); the pool carries them unread. */
import type { CalibrationOptions, CalibrationResult, RecordedTrace } from "@/lib/calibration/fit";
import type { TaskPort } from "@/lib/jobs/protocol";
import type { MeshChoice } from "@/lib/studies/mesh-choice";

/** What the main thread sends to a worker thread for one run. */
export interface SimulationTask extends TaskPort {
  /** Absent on run tasks (the first kind there was). */
  kind?: "run";
  runId: number;
  /** A validated engine scenario (the run's stored inputs). */
  scenario: unknown;
  frameBudget?: number;
  /** The engine's budget (wall time in ms) for this run. */
  budgetMs?: number;
}

/**
 * A calibration: the fit of lib/calibration/fit.ts over a recorded take-up trace. Everything the fit needs
 * comes in the task (the worker thread never reads the database); the fit comes back as the outcome.
 */
export interface CalibrationTask extends TaskPort {
  kind: "calibration";
  calibrationId: number;
  /** A validated engine scenario: the recording's lift revision with the chosen scenario's train and entry. */
  scenario: unknown;
  trace: RecordedTrace;
  options: Omit<CalibrationOptions, "onProgress">;
}

export type CalibrationOutcome =
  | { ok: true; result: CalibrationResult; wallTimeMs: number }
  | { ok: false; code: string; message: string; wallTimeMs: number };

/** A study's mesh choice (lib/studies/mesh-choice.ts) on its probe cases, before its grid runs. */
export interface StudyMeshTask extends TaskPort {
  kind: "study-mesh";
  studyId: number;
  /** Validated engine scenarios of the probe cases. */
  probes: unknown[];
  budgetMs?: number;
}

export type StudyMeshOutcome = { ok: true; choice: MeshChoice; wallTimeMs: number } | { ok: false; message: string; wallTimeMs: number };

export type WorkerTask = SimulationTask | CalibrationTask | StudyMeshTask;

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
