/**
 * The BullMQ execution mode: one Redis queue of jobs (runs, calibration fits: the caller names the kinds
 * and hands their handlers to the worker); workers (`npm run worker`, or a test's own) take a job and call
 * its handler, which runs it in the local worker-thread pool and writes its outcome exactly as the
 * in-process pool does. Per-organisation concurrency is a Redis sorted set of the organisation's running
 * jobs (stale entries expire), checked atomically; per-organisation priorities keep the waiting line fair.
 * Knows no domain: the handlers come from the caller (lib/engine/queue-worker.ts).
 */
import { Queue, Worker, DelayedError, type Job } from "bullmq";
import IORedis, { type Redis } from "ioredis";
import { getJobPool, QueueFullError, type Slot } from "./pool";
import { orgConcurrency, QUEUE_RUNNER } from "./dispatch";

export const QUEUE_NAME = "tautline-runs";

/** What every queued job carries; the rest of its data is its handler's. */
export interface QueuedJobData {
  organisationId: number;
}

export interface QueueJobContext {
  /** A place in this process's worker-thread pool for the job's organisation, waiting while it is full. */
  localSlot(): Promise<Slot>;
}

/** Runs one taken job to its end (its data as enqueued). */
export type QueueJobHandler = (data: QueuedJobData, ctx: QueueJobContext) => Promise<void>;

/** A job that finished (any outcome), by kind: e.g. studies copy a run's figures into its case. */
export type JobFinishedHook = (name: string, data: QueuedJobData) => Promise<void>;

function redisUrl(): string {
  const url = process.env.REDIS_URL;
  if (!url) throw new Error("REDIS_URL is not set: the queue mode needs a Redis server.");
  return url;
}

export function redisConnection(url = redisUrl()): Redis {
  // BullMQ workers block on Redis: they need maxRetriesPerRequest null.
  return new IORedis(url, { maxRetriesPerRequest: null });
}

const state = globalThis as unknown as { tautlineRunQueue?: { url: string; queue: Queue; redis: Redis } };

function queueState() {
  const url = redisUrl();
  if (state.tautlineRunQueue?.url !== url) {
    state.tautlineRunQueue = { url, queue: new Queue(QUEUE_NAME, { connection: redisConnection(url) }), redis: redisConnection(url) };
  }
  return state.tautlineRunQueue;
}

export function getRunQueue(): Queue {
  return queueState().queue;
}

export async function closeRunQueue(): Promise<void> {
  const q = state.tautlineRunQueue;
  state.tautlineRunQueue = undefined;
  if (q) {
    await q.queue.close();
    q.redis.disconnect();
  }
}

const orgQueuedKey = (organisationId: number) => `tautline:org-queued:${organisationId}`;
// BullMQ's largest priority.
const MAX_PRIORITY = 2_097_152;

/**
 * Fair share in Redis: a job's priority is how many jobs its organisation has waiting, itself included
 * (lower goes first, ties in order of arrival). An organisation's n-th waiting job therefore goes after
 * every other organisation's first n: a 400-case study queued ahead does not hold back a single run.
 */
async function fairPriority(organisationId: number): Promise<number> {
  return Math.min(await queueState().redis.incr(orgQueuedKey(organisationId)), MAX_PRIORITY);
}

/** Adds a job of kind `name` (id unique within the kind); it waits for its organisation's turn. */
export async function enqueueJob(name: string, id: number, data: QueuedJobData): Promise<void> {
  const priority = await fairPriority(data.organisationId);
  await getRunQueue().add(name, data, { jobId: `${name}-${id}`, priority, removeOnComplete: true, removeOnFail: 1000 });
}

const DECREMENT_FLOORED = `
if redis.call('DECR', KEYS[1]) < 0 then redis.call('SET', KEYS[1], 0) end
return 1`;

/** Removes a waiting job (a cancelled run); a job already taken notices the cancel itself. */
export async function removeQueuedJob(name: string, id: number, organisationId: number): Promise<void> {
  try {
    const removed = await getRunQueue().remove(`${name}-${id}`);
    if (removed) {
      await queueState().redis.eval(DECREMENT_FLOORED, 1, orgQueuedKey(organisationId));
    }
  } catch {
    // Locked by a worker that is running it: that worker sees the cancelled row and stops.
  }
}

// Atomic "take a place for this organisation": drop entries older than the stale age, then add the job
// if there is room. Entries are refreshed while the job runs, so a crashed worker's place expires.
// A job taken for the first time no longer waits: its organisation's waiting count (KEYS[2]) goes down.
const ACQUIRE = `
redis.call('ZREMRANGEBYSCORE', KEYS[1], '-inf', tonumber(ARGV[1]) - tonumber(ARGV[3]))
if redis.call('ZSCORE', KEYS[1], ARGV[2]) then
  redis.call('ZADD', KEYS[1], ARGV[1], ARGV[2])
  return 1
end
if redis.call('ZCARD', KEYS[1]) < tonumber(ARGV[4]) then
  redis.call('ZADD', KEYS[1], ARGV[1], ARGV[2])
  if redis.call('DECR', KEYS[2]) < 0 then redis.call('SET', KEYS[2], 0) end
  return 1
end
return 0`;

const STALE_MS = 30_000;
const HEARTBEAT_MS = 5_000;
const RETRY_DELAY_MS = 300;

const orgKey = (organisationId: number) => `tautline:org-running:${organisationId}`;

export interface QueueWorkerOptions {
  /** The handler of each kind of job (job name → handler). */
  handlers: Record<string, QueueJobHandler>;
  /** Jobs run at once by this worker (default JOB_WORKERS). */
  concurrency?: number;
  onFinished?: JobFinishedHook;
}

export interface QueueWorker {
  worker: Worker;
  close(): Promise<void>;
}

/** Starts a BullMQ worker in this process for the kinds of job in `opts.handlers`. */
export function startQueueWorker(opts: QueueWorkerOptions): QueueWorker {
  const url = redisUrl();
  const redis = redisConnection(url);
  const concurrency = opts.concurrency ?? getJobPool().config.workers;
  const limit = orgConcurrency();

  const processor = async (job: Job<QueuedJobData>, token?: string) => {
    const data = job.data;
    const handler = opts.handlers[job.name];
    if (!handler) throw new Error(`No handler for queued jobs of kind "${job.name}".`);
    const member = job.id ?? `${job.name}-?`;
    const got = await redis.eval(ACQUIRE, 2, orgKey(data.organisationId), orgQueuedKey(data.organisationId), Date.now(), member, STALE_MS, limit);
    if (got !== 1) {
      // The organisation already runs its share: try again shortly, letting other organisations' jobs by.
      await job.moveToDelayed(Date.now() + RETRY_DELAY_MS, token);
      throw new DelayedError();
    }
    const heartbeat = setInterval(() => {
      void redis.zadd(orgKey(data.organisationId), Date.now(), member).catch(() => undefined);
    }, HEARTBEAT_MS);
    try {
      await handler(data, { localSlot: () => localSlot(data.organisationId) });
    } finally {
      clearInterval(heartbeat);
      await redis.zrem(orgKey(data.organisationId), member);
    }
    if (opts.onFinished) await opts.onFinished(job.name, data);
  };

  const worker = new Worker<QueuedJobData>(QUEUE_NAME, processor, { connection: redisConnection(url), concurrency });
  worker.on("error", (err) => console.error("job queue worker:", err.message));
  return {
    worker,
    close: async () => {
      await worker.close();
      redis.disconnect();
    },
  };
}

/** A place in this worker's own pool, waiting for one when every local thread is busy. */
async function localSlot(organisationId: number): Promise<Slot> {
  for (;;) {
    try {
      return getJobPool().reserve(organisationId);
    } catch (err) {
      if (!(err instanceof QueueFullError)) throw err;
      await new Promise((r) => setTimeout(r, RETRY_DELAY_MS));
    }
  }
}

export { QUEUE_RUNNER };
