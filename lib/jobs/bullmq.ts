/**
 * The BullMQ execution mode: one Redis queue of run and calibration jobs; workers (`npm run worker`, or
 * the test's own) take a job, run the engine in their local worker-thread pool, and write the outcome to
 * the database exactly as the in-process pool does (lib/runs/runner.ts, lib/calibration/runner.ts). Per-organisation concurrency is a Redis
 * sorted set of the organisation's running jobs (stale entries expire), checked atomically.
 */
import { Queue, Worker, DelayedError, type Job } from "bullmq";
import IORedis, { type Redis } from "ioredis";
import { Op } from "sequelize";
import { getModels } from "@/models";
import { dispatchRun, abortRun, type SolverSettings } from "@/lib/runs/runner";
import { dispatchCalibration } from "@/lib/calibration/runner";
import { RUNNER_ID, runnerMayBeAlive } from "@/lib/runs/runner-id";
import { getJobPool, QueueFullError } from "./pool";
import { orgConcurrency, QUEUE_RUNNER } from "./dispatch";

export const QUEUE_NAME = "tautline-runs";

export interface RunJobData {
  runId: number;
  organisationId: number;
  solver: SolverSettings;
  studyCaseId?: number;
}

/** A calibration job (job name "calibration"): the row holds the fit's inputs. */
export interface CalibrationJobData {
  calibrationId: number;
  organisationId: number;
}

type JobData = RunJobData | CalibrationJobData;

/** A job that finished (any outcome): studies use it to copy the run's figures into the case. */
export type RunFinishedHook = (data: RunJobData) => Promise<void>;

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

export async function enqueueRun(data: RunJobData): Promise<void> {
  const priority = await fairPriority(data.organisationId);
  await getRunQueue().add("run", data, { jobId: `run-${data.runId}`, priority, removeOnComplete: true, removeOnFail: 1000 });
}

export async function enqueueCalibration(data: CalibrationJobData): Promise<void> {
  const priority = await fairPriority(data.organisationId);
  await getRunQueue().add("calibration", data, { jobId: `calibration-${data.calibrationId}`, priority, removeOnComplete: true, removeOnFail: 1000 });
}

const DECREMENT_FLOORED = `
if redis.call('DECR', KEYS[1]) < 0 then redis.call('SET', KEYS[1], 0) end
return 1`;

/** Removes a waiting job (a cancelled run); a job already taken notices the cancel itself. */
export async function removeQueuedRun(runId: number, organisationId?: number): Promise<void> {
  try {
    const removed = await getRunQueue().remove(`run-${runId}`);
    if (removed && organisationId !== undefined) {
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
const CANCEL_POLL_MS = 400;

const orgKey = (organisationId: number) => `tautline:org-running:${organisationId}`;

export interface QueueWorkerOptions {
  /** Jobs run at once by this worker (default JOB_WORKERS). */
  concurrency?: number;
  onFinished?: RunFinishedHook;
}

export interface QueueWorker {
  worker: Worker;
  close(): Promise<void>;
}

/** Starts a BullMQ worker for run and calibration jobs in this process. */
export function startQueueWorker(opts: QueueWorkerOptions = {}): QueueWorker {
  const url = redisUrl();
  const redis = redisConnection(url);
  const concurrency = opts.concurrency ?? getJobPool().config.workers;
  const limit = orgConcurrency();

  const processor = async (job: Job<JobData>, token?: string) => {
    const data = job.data;
    const calibration = job.name === "calibration" ? (data as CalibrationJobData) : null;
    const member = calibration ? `calibration-${calibration.calibrationId}` : `run-${(data as RunJobData).runId}`;
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
      if (calibration) await calibrateOne(calibration);
      else await runOne(data as RunJobData);
    } finally {
      clearInterval(heartbeat);
      await redis.zrem(orgKey(data.organisationId), member);
    }
    if (!calibration && opts.onFinished) await opts.onFinished(data as RunJobData);
  };

  const worker = new Worker<JobData>(QUEUE_NAME, processor, { connection: redisConnection(url), concurrency });
  worker.on("error", (err) => console.error("run queue worker:", err.message));
  return {
    worker,
    close: async () => {
      await worker.close();
      redis.disconnect();
    },
  };
}

/** A place in this worker's own pool, waiting for one when every local thread is busy. */
async function localSlot(organisationId: number) {
  for (;;) {
    try {
      return getJobPool().reserve(organisationId);
    } catch (err) {
      if (!(err instanceof QueueFullError)) throw err;
      await new Promise((r) => setTimeout(r, RETRY_DELAY_MS));
    }
  }
}

/** Takes the calibration (if it still waits, or its worker died) and fits it in the local pool. */
async function calibrateOne(data: CalibrationJobData): Promise<void> {
  const { Calibration } = getModels();
  const before = await Calibration.findByPk(data.calibrationId, { attributes: ["id", "status", "runner"] });
  if (!before) return;
  const takeOver = before.status === "running" && before.runner !== QUEUE_RUNNER && !runnerMayBeAlive(before.runner);
  if (before.status !== "queued" && !takeOver) return;
  const [taken] = await Calibration.update(
    { runner: RUNNER_ID },
    { where: { id: data.calibrationId, status: before.status, runner: before.runner ?? { [Op.is]: null } } },
  );
  if (!taken) return;
  const cal = await Calibration.scope("withInputs").findByPk(data.calibrationId);
  if (!cal) return;
  await dispatchCalibration(cal, await localSlot(data.organisationId));
}

/** Takes the run (if it still waits), runs it in the local pool, and stops it when its row is cancelled. */
async function runOne(data: RunJobData): Promise<void> {
  const { Run } = getModels();
  // A job whose run was cancelled or finished meanwhile is dropped; a run whose worker died is taken over.
  const before = await Run.findByPk(data.runId, { attributes: ["id", "status", "runner"] });
  if (!before) return;
  const takeOver = before.status === "running" && before.runner !== QUEUE_RUNNER && !runnerMayBeAlive(before.runner);
  if (before.status !== "queued" && !takeOver) return;
  const [taken] = await Run.update(
    { runner: RUNNER_ID },
    { where: { id: data.runId, status: before.status, runner: before.runner ?? { [Op.is]: null } } },
  );
  if (!taken) return;
  const run = await Run.findByPk(data.runId);
  if (!run) return;
  const done = dispatchRun(run, data.solver, await localSlot(data.organisationId));
  const poll = setInterval(() => {
    void Run.findByPk(data.runId, { attributes: ["id", "status"] }).then((r) => {
      if (!r || r.status === "cancelled") void abortRun(data.runId);
    });
  }, CANCEL_POLL_MS);
  try {
    await done;
  } finally {
    clearInterval(poll);
  }
}

export { QUEUE_RUNNER };
