"use client";
/**
 * Runs scenarios in Web Workers: one worker for full runs (progress, cancel = terminate), one for coarse
 * what-if previews (only the newest request is kept while one is in flight).
 */
import { useCallback, useEffect, useRef } from "react";
import type { Scenario } from "@/sim";
import { useRunStore } from "./store";
import type { RunData, WorkerMessage } from "./types";

function newWorker(): Worker {
  return new Worker(new URL("./worker.ts", import.meta.url), { type: "module" });
}

export function useWorkerRun() {
  const full = useRef<Worker | null>(null);
  const preview = useRef<Worker | null>(null);
  const seq = useRef(0);
  const pending = useRef<{ scenario: Scenario; startedAt: number } | null>(null);
  const previewInFlight = useRef(false);
  /** Sequence number of the latest full run: a preview asked for before it must not cover its result. */
  const lastFull = useRef(0);
  const set = useRunStore((s) => s.set);

  useEffect(
    () => () => {
      full.current?.terminate();
      preview.current?.terminate();
    },
    [],
  );

  const runFull = useCallback(
    (scenario: Scenario): Promise<RunData | null> => {
      full.current?.terminate();
      const w = newWorker();
      full.current = w;
      const id = ++seq.current;
      lastFull.current = id;
      pending.current = null;
      set({ status: "running", progress: 0, error: null, progressEvents: 0 });
      let events = 0;
      return new Promise((resolve) => {
        w.onmessage = (e: MessageEvent<WorkerMessage>) => {
          const m = e.data;
          if (m.id !== id) return;
          if (m.type === "progress") set({ progress: m.fraction, progressEvents: ++events });
          else if (m.type === "done") {
            const data: RunData = { ...m.data, origin: "browser" };
            set({ status: "done", progress: 1, data, preview: null });
            resolve(data);
          } else {
            set({ status: "failed", error: m.message });
            resolve(null);
          }
        };
        w.onerror = (ev) => {
          set({ status: "failed", error: ev.message || "The run worker stopped with an error." });
          resolve(null);
        };
        w.postMessage({ id, scenario, coarse: false });
      });
    },
    [set],
  );

  const cancel = useCallback(() => {
    full.current?.terminate();
    full.current = null;
    set({ status: "cancelled" });
  }, [set]);

  /** Queues a coarse preview; while one runs, only the newest request waits. */
  const runPreview = useCallback(
    (scenario: Scenario) => {
      pending.current = { scenario, startedAt: performance.now() };
      const pump = () => {
        const job = pending.current;
        if (!job || previewInFlight.current) return;
        pending.current = null;
        if (!preview.current) preview.current = newWorker();
        const w = preview.current;
        const id = ++seq.current;
        previewInFlight.current = true;
        set({ previewBusy: true });
        w.onmessage = (e: MessageEvent<WorkerMessage>) => {
          const m = e.data;
          if (m.id !== id) return;
          previewInFlight.current = false;
          // A full run started since: keep its result on screen, but still record how long the preview took.
          if (lastFull.current > id)
            set({ previewBusy: !!pending.current, ...(m.type === "done" ? { previewLatencyMs: performance.now() - job.startedAt } : {}) });
          else if (m.type === "done")
            set({ preview: { ...m.data, origin: "preview" }, previewLatencyMs: performance.now() - job.startedAt, previewBusy: !!pending.current });
          else if (m.type === "error") set({ error: m.message, previewBusy: !!pending.current });
          pump();
        };
        w.postMessage({ id, scenario: job.scenario, coarse: true });
      };
      pump();
    },
    [set],
  );

  return { runFull, cancel, runPreview };
}
