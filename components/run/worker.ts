/// <reference lib="webworker" />
/**
 * The browser's run worker: takes a scenario, runs sim's simulate() off the main thread, posts progress
 * about every 1 % (full runs) and then the result with its checks; the series travel as one transferred
 * Float64Array. The page keeps the worker warm (a "warm" request runs a few previews so the engine is
 * compiled before the first slider move); cancelling a full run = the page terminates this worker and starts a fresh one.
 */
import { packSeries, runScenario } from "./compute";
import { wallNow } from "./previewTiming";
import type { WorkerMessage, WorkerRequest } from "./types";

const scope = self as unknown as DedicatedWorkerGlobalScope;
const post = (m: WorkerMessage, transfer: Transferable[] = []) => scope.postMessage(m, transfer);

/** Warm-up previews still to run; a real request sets it to 0. */
let warmLeft = 0;

/** One warm-up preview per task, so a real request waiting in the queue goes first and ends the warm-up. */
function warmStep(scenario: WorkerRequest & { type: "warm" }): void {
  if (warmLeft <= 0) return void post({ type: "warm" });
  warmLeft--;
  try {
    runScenario(scenario.scenario, true);
  } catch {
    warmLeft = 0; // a scenario the engine refuses: the real run reports it
  }
  setTimeout(() => warmStep(scenario), 0);
}

scope.onmessage = (e: MessageEvent<WorkerRequest>) => {
  const req = e.data;
  const received = wallNow();
  if (req.type === "warm") {
    warmLeft = Math.max(1, req.runs);
    warmStep(req);
    return;
  }
  warmLeft = 0;
  const { id, scenario, coarse } = req;
  let setupDone = 0;
  let integrated = 0;
  try {
    const data = runScenario(scenario, coarse, (fraction) => {
      const t = wallNow();
      if (!setupDone) setupDone = t;
      if (fraction >= 1) integrated = t;
      if (!coarse) post({ type: "progress", id, fraction });
    });
    const computed = wallNow();
    const { series, ...rest } = data;
    const packed = packSeries(series);
    post(
      { type: "done", id, data: { ...rest, packed }, timing: { received, setupDone: setupDone || computed, integrated: integrated || computed, computed, posted: wallNow() } },
      [packed.values.buffer],
    );
  } catch (err) {
    const e2 = err as { message?: string; code?: string };
    post({ type: "error", id, message: e2.message ?? String(err), code: e2.code });
  }
};
