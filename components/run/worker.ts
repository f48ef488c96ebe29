/// <reference lib="webworker" />
/**
 * The browser's run worker: takes a scenario, runs sim's simulate() off the main thread, posts progress
 * about every 1 % and then the result with its checks. Cancelling = the page terminates this worker.
 */
import { runScenario } from "./compute";
import type { WorkerMessage, WorkerRequest } from "./types";

const post = (m: WorkerMessage) => (self as unknown as DedicatedWorkerGlobalScope).postMessage(m);

self.onmessage = (e: MessageEvent<WorkerRequest>) => {
  const { id, scenario, coarse } = e.data;
  try {
    const data = runScenario(scenario, coarse, coarse ? undefined : (fraction) => post({ type: "progress", id, fraction }));
    post({ type: "done", id, data });
  } catch (err) {
    const e2 = err as { message?: string; code?: string };
    post({ type: "error", id, message: e2.message ?? String(err), code: e2.code });
  }
};
