import { execFileSync } from "node:child_process";
import { existsSync, statSync } from "node:fs";
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

function mtime(file: string): number {
  try {
    return statSync(file).mtimeMs;
  } catch {
    return 0;
  }
}

/** Whether the bundle must be (re)built before the pool starts. */
function needsBuild(file: string): boolean {
  if (process.env.JOB_WORKER_FILE) return false; // given from outside: use as is
  if (!existsSync(file)) return true;
  // Outside production: once per process, so `npm run dev` and the tests always run the current engine.
  if (process.env.NODE_ENV !== "production") return !state.tautlineWorkerBundled;
  // Production: rebuild when the bundle is older than the Next build it serves (npm start rebuilds Next).
  return mtime(file) < mtime(path.join(projectRoot(), ".next", "BUILD_ID"));
}

/**
 * Makes sure the worker bundle exists and is current; returns its absolute path. `npm run build`
 * bundles it before `next build`; this covers every other way the server is started.
 */
export function ensureWorkerBundle(): string {
  const file = workerFile();
  if (needsBuild(file)) {
    const script = path.join(projectRoot(), "lib", "jobs", "build-worker.mjs");
    execFileSync(process.execPath, [script, file], { stdio: ["ignore", "ignore", "inherit"], timeout: 60_000 });
  }
  state.tautlineWorkerBundled = true;
  return file;
}
