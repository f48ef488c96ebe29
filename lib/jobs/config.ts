/** Job pool settings from the environment. */
export interface JobConfig {
  /** Worker threads running the engine (JOB_WORKERS, default 1: the machine has 2 cores). */
  workers: number;
  /** Jobs (runs, calibration fits) that may wait for a worker (JOB_QUEUE_MAX, default 8); beyond, starting one answers 503. */
  queueMax: number;
  /** An idle worker thread exits after this long (JOB_IDLE_MS, default 60 s). */
  idleMs: number;
}

function positiveInt(value: string | undefined, fallback: number, min: number): number {
  const n = Number(value);
  return Number.isInteger(n) && n >= min ? n : fallback;
}

export function jobConfig(env: NodeJS.ProcessEnv = process.env): JobConfig {
  return {
    workers: positiveInt(env.JOB_WORKERS, 1, 1),
    queueMax: positiveInt(env.JOB_QUEUE_MAX, 8, 0),
    idleMs: positiveInt(env.JOB_IDLE_MS, 60_000, 1000),
  };
}
