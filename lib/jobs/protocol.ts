import type { MessagePort } from "node:worker_threads";

/** Every task handed to a worker thread carries a port for messages back while it runs. */
export interface TaskPort {
  port: MessagePort;
}

/** Messages a worker posts on the task's port. */
export type WorkerMessage = { type: "started" } | { type: "progress"; value: number };
