"use client";
/**
 * Follows a long job's server-sent events (lib/http/job-events.ts): the one way screens show the progress of
 * runs, calibrations and studies. `onUpdate` gets each `progress` body, `onEnd` the `end` body (by default
 * `onUpdate` gets it too), then the stream is closed.
 *
 * A dropped connection or a failed read on the server is retried with a growing pause (1, 2, 4, 8 s); an
 * answer that is not a stream (401, 404, 503 …) is read once for its message. After five failures in a row
 * without news of the job, or at once when the server refuses for good (4xx), `error` says what went wrong
 * and the hook stops; `retry()` starts again.
 */
import { useCallback, useEffect, useRef, useState } from "react";

export type JobEventsState = "idle" | "connecting" | "open" | "reconnecting" | "ended" | "failed";

export interface JobEventHandlers<P, E> {
  onUpdate: (data: P) => void;
  onEnd?: (data: E) => void;
}

const MAX_FAILURES = 5;
const backoffMs = (failures: number) => Math.min(8000, 1000 * 2 ** (failures - 1));

/** The error message of an answer that is not an event stream, and whether trying again may help. */
async function refusalOf(url: string): Promise<{ message: string; final: boolean } | null> {
  const ctl = new AbortController();
  try {
    const res = await fetch(url, { signal: ctl.signal, headers: { Accept: "text/event-stream" } });
    if (res.ok) return null;
    const body = (await res.json().catch(() => ({}))) as { error?: unknown };
    const message = typeof body.error === "string" ? body.error : `The server answered ${res.status}.`;
    return { message, final: res.status >= 400 && res.status < 500 && res.status !== 408 && res.status !== 429 };
  } catch {
    return null; // offline: the next attempt will tell
  } finally {
    ctl.abort();
  }
}

/** Follows `url` while it is not null; a new url closes the old stream and opens the new one. */
export function useJobEvents<P, E = P>(url: string | null, handlers: JobEventHandlers<P, E>): { state: JobEventsState; error: string | null; retry: () => void } {
  const [attempt, setAttempt] = useState(0);
  // What the stream of this url and attempt reported (an older stream's report is not shown).
  const [report, setReport] = useState<{ url: string; attempt: number; state: JobEventsState; error: string | null } | null>(null);
  const latest = useRef(handlers);
  useEffect(() => {
    latest.current = handlers;
  });

  useEffect(() => {
    if (!url) return;
    let live = true;
    const setState = (state: JobEventsState, error: string | null = null) => setReport({ url, attempt, state, error });
    let es: EventSource | null = null;
    let timer: ReturnType<typeof setTimeout> | undefined;
    let failures = 0;

    const fail = (message: string) => setState("failed", message);
    const connect = () => {
      if (!live) return;
      const source = new EventSource(url);
      es = source;
      source.addEventListener("open", () => {
        if (live) setState("open");
      });
      source.addEventListener("progress", (e) => {
        if (!live) return;
        failures = 0;
        setState("open");
        latest.current.onUpdate(JSON.parse((e as MessageEvent<string>).data) as P);
      });
      source.addEventListener("end", (e) => {
        source.close();
        if (!live) return;
        setState("ended");
        const data = JSON.parse((e as MessageEvent<string>).data);
        const { onEnd, onUpdate } = latest.current;
        if (onEnd) onEnd(data as E);
        else onUpdate(data as P);
      });
      // Both the server's `error` event (a failed read) and a lost or refused connection.
      source.addEventListener("error", (e) => {
        const refused = source.readyState === EventSource.CLOSED;
        source.close();
        if (!live) return;
        failures += 1;
        const data = (e as MessageEvent<string>).data;
        const said = typeof data === "string" ? ((JSON.parse(data) as { message?: string }).message ?? null) : null;
        const lost = said ?? "Lost the connection to the server.";
        if (failures >= MAX_FAILURES) return fail(`${lost} Reload the page to follow the job again.`);
        setState("reconnecting");
        timer = setTimeout(async () => {
          const refusal = refused ? await refusalOf(url) : null;
          if (!live) return;
          if (refusal?.final) return fail(refusal.message);
          connect();
        }, backoffMs(failures));
      });
    };
    connect();
    return () => {
      live = false;
      if (timer) clearTimeout(timer);
      es?.close();
    };
  }, [url, attempt]);

  const retry = useCallback(() => setAttempt((n) => n + 1), []);
  const current = report && report.url === url && report.attempt === attempt ? report : null;
  return { state: url ? (current?.state ?? "connecting") : "idle", error: url ? (current?.error ?? null) : null, retry };
}
