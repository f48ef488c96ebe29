/** Job pool settings from the environment. */
export interface JobConfig {
  /** Worker threads running the engine (JOB_WORKERS, default 1: the machine has 2 cores). */
  workers: number;
  /** Jobs (runs, calibration fits) that may wait for a worker (JOB_QUEUE_MAX, default 8); beyond, starting one answers 503. */
  queueMax: number;
  /** An idle worker thread exits after this long (JOB_IDLE_MS, default 60 s). */
  idleMs: number;
  /** Most jobs of one organisation running at once (JOB_ORG_CONCURRENCY, default 2), in both modes. */
  orgConcurrency: number;
  /**
   * Extra threads (JOB_BURST_THREADS, default 2) that start the first job of an organisation with nothing
   * running when every worker is busy with other organisations' jobs (lib/jobs/fair-queue.ts).
   */
  burstThreads: number;
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
    orgConcurrency: positiveInt(env.JOB_ORG_CONCURRENCY, 2, 1),
    burstThreads: positiveInt(env.JOB_BURST_THREADS, 2, 0),
  };
}

/**
 * Places (running + waiting) one organisation may hold in the pool: half the pool's places, at least its
 * running share, so the other half always stays free for other organisations.
 */
export function orgPlaces(config: JobConfig): number {
  return Math.max(config.orgConcurrency, Math.ceil((config.workers + config.queueMax) / 2));
}
