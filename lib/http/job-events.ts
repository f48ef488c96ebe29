/**
 * Progress of a long job (run, calibration, study) as server-sent events: the one way Tautline reports it.
 * The caller passes a reader of the job's state; the reader goes to the database, so the stream works
 * whichever process runs the job (the in-process pool or a BullMQ worker on Redis). Knows no domain.
 *
 * Protocol: `progress` whenever the state changes (first one at once), a `: keep-alive` comment when
 * nothing was sent for a while, then one `end` with the final state and the stream closes. A failed read
 * sends `error` ({ message }) and closes; the client reconnects (lib/client/job-events.ts).
 */
import { HttpError } from "./errors";

export interface JobEventSource<S> {
  /**
   * Reads the job's state, with the caller's permission and organisation checks. Null, or a 404
   * HttpError, when the job is gone; other throws answer the request (first read) or end the stream.
   */
  read: () => Promise<S | null>;
  /** True once the state will not change any more (done, failed, cancelled). */
  finished: (state: S) => boolean;
  /** Body of a `progress` event (default: the state). */
  progress?: (state: S) => unknown;
  /** Body of the `end` event (default: the state). */
  end?: (state: S) => unknown;
  /** Body of the `end` event when the job is gone (deleted meanwhile). */
  gone: unknown;
  /** What decides that the state changed (default: the `progress` body as JSON). */
  key?: (state: S) => string;
  /** Names the job in the server log, e.g. "run 12". */
  label: string;
  /** How often the state is read, in ms (default 500). */
  intervalMs?: number;
  /** Longest silence before a keep-alive comment, in ms (default 15 000). */
  heartbeatMs?: number;
}

const DEFAULT_INTERVAL_MS = 500;
const DEFAULT_HEARTBEAT_MS = 15_000;
/** How long a browser waits before it reconnects a dropped stream (the SSE `retry` field). */
const RETRY_MS = 2000;

export const EVENT_STREAM_HEADERS = {
  "Content-Type": "text/event-stream; charset=utf-8",
  "Cache-Control": "no-cache, no-transform",
  Connection: "keep-alive",
  "X-Accel-Buffering": "no",
} as const;

function frame(event: string, data: unknown, id?: number): string {
  return `${id !== undefined ? `id: ${id}\n` : ""}event: ${event}\ndata: ${JSON.stringify(data)}\n\n`;
}

async function readOrGone<S>(source: JobEventSource<S>): Promise<S | null> {
  try {
    return await source.read();
  } catch (err) {
    if (err instanceof HttpError && err.status === 404) return null;
    throw err;
  }
}

/**
 * Reads the job once (so a missing permission, another organisation's job or a lost database answers as
 * JSON with its status), then answers 200 with the event stream. Stops reading when `signal` aborts (the
 * client went away) or the stream is cancelled.
 */
export async function jobEvents<S>(source: JobEventSource<S>, signal: AbortSignal): Promise<Response> {
  const first = await source.read();
  return new Response(jobEventStream(source, first, signal), { headers: EVENT_STREAM_HEADERS });
}

function jobEventStream<S>(source: JobEventSource<S>, first: S | null, signal: AbortSignal): ReadableStream<Uint8Array> {
  const enc = new TextEncoder();
  const intervalMs = source.intervalMs ?? DEFAULT_INTERVAL_MS;
  const heartbeatMs = source.heartbeatMs ?? DEFAULT_HEARTBEAT_MS;
  const progressOf = source.progress ?? ((s: S) => s);
  const keyOf = source.key ?? ((s: S) => JSON.stringify(progressOf(s)));
  let timer: ReturnType<typeof setTimeout> | undefined;
  let closed = false;
  const stop = () => {
    closed = true;
    if (timer) clearTimeout(timer);
    signal.removeEventListener("abort", stop);
  };

  return new ReadableStream<Uint8Array>({
    start(controller) {
      let lastKey: string | null = null;
      let lastSent = Date.now();
      let seq = 0;
      const send = (text: string) => {
        controller.enqueue(enc.encode(text));
        lastSent = Date.now();
      };
      const close = () => {
        if (closed) return;
        stop();
        try {
          controller.close();
        } catch {
          // the client closed it first
        }
      };
      if (signal.aborted) return close();
      signal.addEventListener("abort", close, { once: true });
      send(`retry: ${RETRY_MS}\n\n`);

      /** Sends what changed; true when the stream has ended. */
      const emit = async (state: S | null): Promise<boolean> => {
        if (state === null) {
          send(frame("end", source.gone, ++seq));
          return true;
        }
        const key = keyOf(state);
        if (key !== lastKey) {
          lastKey = key;
          send(frame("progress", progressOf(state), ++seq));
        } else if (Date.now() - lastSent >= heartbeatMs) {
          send(`: keep-alive\n\n`);
        }
        if (!source.finished(state)) return false;
        send(frame("end", source.end ? await source.end(state) : state, ++seq));
        return true;
      };

      const tick = async (state: S | null | undefined) => {
        if (closed) return;
        try {
          const s = state === undefined ? await readOrGone(source) : state;
          if (closed) return;
          if (await emit(s)) return close();
        } catch (err) {
          if (closed) return;
          console.error(`${source.label}: event stream failed`, err);
          send(frame("error", { message: "Could not read the job's progress." }));
          return close();
        }
        timer = setTimeout(() => void tick(undefined), intervalMs);
      };
      void tick(first);
    },
    cancel() {
      stop();
    },
  });
}
