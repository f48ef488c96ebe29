/**
 * Worker-thread entry of the job pool: runs the engine for one run and packs its result, runs one
 * calibration fit, or chooses a study's mesh. Bundled into one .mjs file by lib/jobs/build-worker.mjs; piscina calls the default
 * export once per task.
 */
import os from "node:os";
import { simulate } from "@/sim/simulate";
import { SimulationError } from "@/sim/errors";
import type { Scenario } from "@/sim/schema";
import { packEngineResult, type EngineResult } from "@/lib/runs/pack";
import { meshCheck } from "@/lib/runs/mesh-check";
import { calibrate } from "@/lib/calibration/fit";
import { probeStudyMesh } from "@/lib/studies/mesh-choice";
import type { WorkerMessage } from "@/lib/jobs/protocol";
import type { CalibrationOutcome, CalibrationTask, SimulationOutcome, SimulationTask, StudyMeshOutcome, StudyMeshTask, WorkerTask } from "./protocol";

// Engine threads yield the CPU to the request thread: on Linux a thread's nice value is its own, so this
// lowers only this worker thread (JOB_NICE, default 10; 0 keeps the normal priority). Where the platform
// refuses, the engine simply runs at normal priority.
lowerThreadPriority(Number(process.env.JOB_NICE ?? 10));

function lowerThreadPriority(nice: number): void {
  if (!Number.isInteger(nice) || nice <= 0) return;
  try {
    os.setPriority(Math.min(nice, 19));
  } catch {
    // not permitted here: normal priority
  }
}

// Progress messages at most this often: the main thread writes them to the database, throttled again.
const PROGRESS_EVERY_MS = 100;

export default async function runTask(task: WorkerTask): Promise<SimulationOutcome | CalibrationOutcome | StudyMeshOutcome> {
  if (task.kind === "calibration") return runCalibrationTask(task);
  if (task.kind === "study-mesh") return runStudyMeshTask(task);
  return runSimulationTask(task);
}

/** A study's mesh choice: its probe cases at doubling meshes (no series, no frames). */
function runStudyMeshTask(task: StudyMeshTask): StudyMeshOutcome {
  const t0 = performance.now();
  task.port.postMessage({ type: "started" } satisfies WorkerMessage);
  try {
    const choice = probeStudyMesh(task.probes as Scenario[], { budgetMs: task.budgetMs });
    return { ok: true, choice, wallTimeMs: Math.round(performance.now() - t0) };
  } catch (err) {
    return { ok: false, message: err instanceof Error ? err.message : String(err), wallTimeMs: Math.round(performance.now() - t0) };
  } finally {
    task.port.close();
  }
}

/** One fit: pure compute on the trace and scenario it was given (about 60 coarse engine runs). */
function runCalibrationTask(task: CalibrationTask): CalibrationOutcome {
  const post = (m: WorkerMessage) => task.port.postMessage(m);
  const t0 = performance.now();
  let lastPost = 0;
  post({ type: "started" });
  try {
    const result = calibrate(task.scenario as Scenario, task.trace, {
      ...task.options,
      onProgress: (f) => {
        const now = performance.now();
        if (now - lastPost < PROGRESS_EVERY_MS) return;
        lastPost = now;
        post({ type: "progress", value: f });
      },
    });
    return { ok: true, result, wallTimeMs: Math.round(performance.now() - t0) };
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    return { ok: false, code: "calibration-error", message, wallTimeMs: Math.round(performance.now() - t0) };
  } finally {
    task.port.close();
  }
}

async function runSimulationTask(task: SimulationTask): Promise<SimulationOutcome> {
  const post = (m: WorkerMessage) => task.port.postMessage(m);
  const t0 = performance.now();
  let lastPost = 0;
  post({ type: "started" });
  try {
    // simulate() is synchronous: this thread is busy until it returns; cancelling ends the thread.
    const result = simulate(task.scenario, {
      frameBudget: task.frameBudget,
      budget: task.budgetMs !== undefined ? { wallTimeMs: task.budgetMs } : undefined,
      onProgress: (f: number) => {
        const now = performance.now();
        if (!Number.isFinite(f) || now - lastPost < PROGRESS_EVERY_MS) return;
        lastPost = now;
        post({ type: "progress", value: Math.min(1, Math.max(0, f)) });
      },
    });
    const packed = packEngineResult(result as unknown as EngineResult);
    // The comparison shares the run's budget: the job's guard stops the thread past it.
    const left = task.budgetMs !== undefined ? task.budgetMs - (performance.now() - t0) : undefined;
    const mesh = meshCheck(task.scenario as Scenario, result.summary, left);
    const diagnostics = { ...packed.diagnostics, ...mesh };
    return { ok: true, ...packed, diagnostics, wallTimeMs: Math.round(performance.now() - t0) };
  } catch (err) {
    const wallTimeMs = Math.round(performance.now() - t0);
    if (err instanceof SimulationError) {
      const diagnostics = { ...err.details, simulatedTime: err.simulatedTime };
      return { ok: false, code: err.code, message: err.message, diagnostics, wallTimeMs };
    }
    const message = err instanceof Error ? err.message : String(err);
    return { ok: false, code: "engine-error", message, wallTimeMs };
  } finally {
    task.port.close();
  }
}

