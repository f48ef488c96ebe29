/**
 * Worker-thread entry: runs the engine for one run and packs its result. Bundled into one .mjs file by
 * lib/jobs/build-worker.mjs; piscina calls the default export once per task.
 */
import { simulate } from "@/sim/simulate";
import { SimulationError } from "@/sim/errors";
import { packEngineResult, type EngineResult } from "@/lib/runs/pack";
import type { SimulationOutcome, SimulationTask, WorkerMessage } from "./protocol";

// Progress messages at most this often: the main thread writes them to the database, throttled again.
const PROGRESS_EVERY_MS = 100;

export default async function runSimulationTask(task: SimulationTask): Promise<SimulationOutcome> {
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
    return { ok: true, ...packEngineResult(result as unknown as EngineResult), wallTimeMs: Math.round(performance.now() - t0) };
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
