/**
 * Where jobs go: the in-process worker-thread pool (default), or BullMQ on Redis when REDIS_URL is set
 * (workers started with `npm run worker`, on any machine that reaches the database and Redis). Each kind
 * of job hands itself to one or the other (lib/runs/queue.ts, lib/calibration/queue.ts).
 */
import { jobConfig } from "./config";

export type JobMode = "pool" | "queue";

export function jobMode(env: NodeJS.ProcessEnv = process.env): JobMode {
  return env.REDIS_URL ? "queue" : "pool";
}

/**
 * The runner id of a job waiting in the Redis queue. Its host part is not this machine's name, so the
 * restart recovery leaves it alone: the job survives a server restart in Redis. A worker that takes the
 * job writes its own runner id.
 */
export const QUEUE_RUNNER = "redis-queue:0:0";

/** Most jobs of one organisation running at once (JOB_ORG_CONCURRENCY, default 2), in both modes. */
export function orgConcurrency(env: NodeJS.ProcessEnv = process.env): number {
  return jobConfig(env).orgConcurrency;
}
