import { Piscina } from "piscina";
import { MessageChannel } from "node:worker_threads";
import { jobConfig, type JobConfig } from "./config";
import { ensureWorkerBundle } from "./worker-bundle";
import type { CalibrationOutcome, CalibrationTask, SimulationOutcome, SimulationTask, WorkerMessage, WorkerTask } from "./protocol";

/** Thrown by `reserve()` when every worker is busy and the queue is full. */
export class QueueFullError extends Error {
  constructor(readonly retryAfterSeconds: number) {
    super("The job queue is full.");
    this.name = "QueueFullError";
  }
}

export interface TaskOptions {
  signal?: AbortSignal;
  onMessage?: (m: WorkerMessage) => void;
}

/** A place in the pool (running or waiting), held from the moment a run or calibration is accepted until it ends. */
export interface Slot {
  release(): void;
}

/**
 * A piscina pool of Node worker threads running the engine off the request thread. It counts its own
 * slots (workers + queue) so a run is refused before anything is stored, not after.
 */
export class JobPool {
  private readonly piscina: Piscina;
  private held = 0;

  constructor(readonly config: JobConfig = jobConfig()) {
    this.piscina = new Piscina({
      filename: ensureWorkerBundle(),
      minThreads: 0,
      maxThreads: config.workers,
      maxQueue: Math.max(config.queueMax, 1),
      idleTimeout: config.idleMs,
    });
  }

  get capacity(): number {
    return this.config.workers + this.config.queueMax;
  }

  /** Holds one place, or throws QueueFullError. */
  reserve(): Slot {
    if (this.held >= this.capacity) throw new QueueFullError(10);
    this.held += 1;
    let released = false;
    return {
      release: () => {
        if (released) return;
        released = true;
        this.held -= 1;
      },
    };
  }

  /** Runs one simulation in a worker thread. Aborting `signal` removes a waiting task or ends its thread. */
  simulate(task: Omit<SimulationTask, "port">, opts: TaskOptions = {}): Promise<SimulationOutcome> {
    return this.run(task, opts) as Promise<SimulationOutcome>;
  }

  /** Runs one calibration fit in a worker thread (same places and queue as runs). */
  calibrate(task: Omit<CalibrationTask, "port">, opts: TaskOptions = {}): Promise<CalibrationOutcome> {
    return this.run(task, opts) as Promise<CalibrationOutcome>;
  }

  private async run(task: Omit<WorkerTask, "port">, opts: TaskOptions): Promise<unknown> {
    const { port1, port2 } = new MessageChannel();
    if (opts.onMessage) port1.on("message", opts.onMessage);
    try {
      return await this.piscina.run({ ...task, port: port2 }, { transferList: [port2], signal: opts.signal });
    } finally {
      port1.close();
    }
  }

  /** Places held (running + waiting), the capacity, tasks piscina has not started yet, live threads. */
  stats(): { held: number; capacity: number; waiting: number; threads: number } {
    return { held: this.held, capacity: this.capacity, waiting: this.piscina.queueSize, threads: this.piscina.threads.length };
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
