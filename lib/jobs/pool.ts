import { Piscina } from "piscina";
import { MessageChannel } from "node:worker_threads";
import { jobConfig, orgPlaces, type JobConfig } from "./config";
import { FairQueue } from "./fair-queue";
import { ensureWorkerBundle } from "./worker-bundle";
import type { TaskPort, WorkerMessage } from "./protocol";

/** Thrown by `reserve()` when every worker is busy and the queue is full. */
export class QueueFullError extends Error {
  constructor(readonly retryAfterSeconds: number) {
    super("The job queue is full.");
    this.name = "QueueFullError";
  }
}

export interface TaskOptions {
  /** The organisation whose job this is: its turn comes from lib/jobs/fair-queue.ts. */
  organisationId: number;
  signal?: AbortSignal;
  onMessage?: (m: WorkerMessage) => void;
}

/** A place in the pool (running or waiting), held from the moment a run or calibration is accepted until it ends. */
export interface Slot {
  organisationId: number;
  release(): void;
}

interface Pending {
  task: object;
  opts: TaskOptions;
  resolve: (v: unknown) => void;
  reject: (err: unknown) => void;
}

function abortError(signal: AbortSignal): Error {
  const err = new Error(`The job was aborted (${String(signal.reason)}).`);
  err.name = "AbortError";
  return err;
}

/**
 * A piscina pool of Node worker threads running the engine off the request thread. It counts its own
 * slots (workers + queue) so a run is refused before anything is stored, not after, and keeps the waiting
 * jobs itself, per organisation (lib/jobs/fair-queue.ts): piscina only ever gets a job a thread is free
 * for, so a cancelled job's thread going away never leaves the next one waiting in piscina's own queue.
 */
export class JobPool {
  private readonly piscina: Piscina;
  private readonly queue: FairQueue<Pending>;
  private held = 0;
  private readonly heldBy = new Map<number, number>();

  constructor(readonly config: JobConfig = jobConfig()) {
    const maxThreads = config.workers + config.burstThreads;
    this.queue = new FairQueue<Pending>({ workers: config.workers, maxThreads, perOrg: config.orgConcurrency });
    this.piscina = new Piscina({
      filename: ensureWorkerBundle(),
      minThreads: 0,
      maxThreads,
      maxQueue: maxThreads,
      idleTimeout: config.idleMs,
    });
  }

  get capacity(): number {
    return this.config.workers + this.config.queueMax;
  }

  /**
   * Holds one place for the organisation, or throws QueueFullError. An organisation with no place held
   * always gets one; others are refused once they hold their share (orgPlaces) or the pool is full.
   */
  reserve(organisationId: number): Slot {
    const mine = this.heldBy.get(organisationId) ?? 0;
    if (mine > 0 && (mine >= orgPlaces(this.config) || this.held >= this.capacity)) throw new QueueFullError(10);
    this.held += 1;
    this.heldBy.set(organisationId, mine + 1);
    let released = false;
    return {
      organisationId,
      release: () => {
        if (released) return;
        released = true;
        this.held -= 1;
        const n = (this.heldBy.get(organisationId) ?? 1) - 1;
        if (n > 0) this.heldBy.set(organisationId, n);
        else this.heldBy.delete(organisationId);
      },
    };
  }

  /**
   * Runs one task in a worker thread (the worker bundle reads it; the pool does not) when its
   * organisation's turn comes, and answers the worker's outcome. Aborting `signal` drops a waiting task
   * with an AbortError or ends the thread of a running one.
   */
  run<Outcome, Task extends TaskPort = TaskPort>(task: Omit<Task, "port">, opts: TaskOptions): Promise<Outcome> {
    return new Promise<unknown>((resolve, reject) => {
      const { signal } = opts;
      if (signal?.aborted) return reject(abortError(signal));
      const pending: Pending = { task, opts, resolve, reject };
      signal?.addEventListener(
        "abort",
        () => {
          if (this.queue.remove(pending)) reject(abortError(signal));
        },
        { once: true },
      );
      this.queue.push(opts.organisationId, pending);
      this.pump();
    }) as Promise<Outcome>;
  }

  /** Starts every job that may start now. */
  private pump(): void {
    for (let next = this.queue.next(); next; next = this.queue.next()) {
      const { organisationId, item } = next;
      this.start(item).then(item.resolve, item.reject).finally(() => {
        this.queue.done(organisationId);
        this.pump();
      });
    }
  }

  private async start({ task, opts }: Pending): Promise<unknown> {
    const { port1, port2 } = new MessageChannel();
    if (opts.onMessage) port1.on("message", opts.onMessage);
    try {
      return await this.piscina.run({ ...task, port: port2 }, { transferList: [port2], signal: opts.signal });
    } finally {
      port1.close();
    }
  }

  /** Places held (running + waiting), the capacity, jobs waiting for their turn, jobs running, live threads. */
  stats(): { held: number; capacity: number; waiting: number; running: number; threads: number } {
    const { running, waiting } = this.queue.stats();
    return { held: this.held, capacity: this.capacity, waiting, running, threads: this.piscina.threads.length };
  }

  async close(): Promise<void> {
    await this.piscina.destroy();
  }
}

const state = globalThis as unknown as { tautlineJobPool?: JobPool };

/** The process-wide pool, created on first use (cached on globalThis so dev reloads keep one pool). */
export function getJobPool(): JobPool {
  if (!state.tautlineJobPool) state.tautlineJobPool = new JobPool();
  return state.tautlineJobPool;
}

/** Closes the process-wide pool (tests; a later getJobPool() makes a new one from the current env). */
export async function closeJobPool(): Promise<void> {
  const pool = state.tautlineJobPool;
  state.tautlineJobPool = undefined;
  if (pool) await pool.close();
}
