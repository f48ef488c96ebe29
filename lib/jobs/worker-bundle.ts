import { execFileSync } from "node:child_process";
import { existsSync } from "node:fs";
import path from "node:path";

/** The project folder: `next start`, `next dev`, vitest and the seed all run from it. */
export function projectRoot(): string {
  return process.env.TAUTLINE_ROOT ?? process.cwd();
}

/** Absolute path of the bundled run worker (built by lib/jobs/build-worker.mjs). */
export function workerFile(): string {
  return process.env.JOB_WORKER_FILE ?? path.join(projectRoot(), ".data", "build", "run-worker.mjs");
}

const state = globalThis as unknown as { tautlineWorkerBundled?: boolean };

/**
 * Makes sure the worker bundle exists. In production it is built by `npm run build`; outside production
 * it is rebuilt once per process, so `npm run dev` and the tests always run the current engine code.
 */
export function ensureWorkerBundle(): string {
  const file = workerFile();
  const rebuild = process.env.NODE_ENV !== "production" && !process.env.JOB_WORKER_FILE && !state.tautlineWorkerBundled;
  if (rebuild || !existsSync(file)) {
    const script = path.join(projectRoot(), "lib", "jobs", "build-worker.mjs");
    execFileSync(process.execPath, [script, file], { stdio: ["ignore", "ignore", "inherit"], timeout: 60_000 });
  }
  state.tautlineWorkerBundled = true;
  return file;
}
