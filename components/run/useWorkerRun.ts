"use client";
/**
 * Runs scenarios in Web Workers: one for full runs (progress; cancel = terminate and start a fresh one), one
 * for coarse what-if previews that stays warm for the page's life. Both are started with the page and run
 * warm-up previews of the scenario (the preview worker several), so the first slider move finds the engine
 * loaded and compiled.
 *
 * Previews: only the latest slider value computes. Moves within one animation frame are coalesced (the first
 * goes at once, the rest wait for the next frame and only the newest is kept); while the worker computes, the
 * newest request waits in a one-place slot and older ones are dropped; a full run still in flight when the
 * slider moves again is superseded (terminated). Results come back with their series as a transferred
 * Float64Array; the preview's latency (slider to plots drawn) is stored when the plots have drawn it.
 */
import { useCallback, useEffect, useRef } from "react";
import type { Scenario } from "@/sim";
import { unpackSeries } from "./compute";
import { previewArrived, previewInput, previewSent, previewUnpacked } from "./previewTiming";
import { useRunStore } from "./store";
import type { RunData, WorkerMessage, WorkerRequest, WorkerResult } from "./types";

/**
 * A run worker; with a scenario, it loads the engine and runs warm-up previews of it at once. The time from creation
 * to that warm-up's end is measured as "whatif:workerStart" (read by scripts/bench-ui.ts): what the first
 * slider move would otherwise wait for.
 */
function newWorker(warmWith: Scenario | null, warmRuns = 1): Worker {
  const created = performance.now();
  const w = new Worker(new URL("./worker.ts", import.meta.url), { type: "module" });
  if (warmWith) {
    const onWarm = (e: MessageEvent<WorkerMessage>) => {
      if (e.data?.type !== "warm") return;
      w.removeEventListener("message", onWarm);
      try {
        performance.measure("whatif:workerStart", { start: created, end: performance.now() });
      } catch {
        // No measure options in this browser: nothing to record.
      }
    };
    w.addEventListener("message", onWarm);
    w.postMessage({ type: "warm", scenario: warmWith, runs: warmRuns } satisfies WorkerRequest);
  }
  return w;
}

/** Warm-up previews the preview worker runs at page load (see the mount effect). */
const PREVIEW_WARM_RUNS = 5;

function toRunData(d: WorkerResult, origin: RunData["origin"]): RunData {
  const { packed, ...rest } = d;
  return { ...rest, series: unpackSeries(packed), origin };
}

export function useWorkerRun(warmWith: Scenario | null = null) {
  const full = useRef<Worker | null>(null);
  const fullBusy = useRef(false);
  const preview = useRef<Worker | null>(null);
  const seq = useRef(0);
  const pending = useRef<{ scenario: Scenario; input: number } | null>(null);
  const previewInFlight = useRef(false);
  const frameRequested = useRef<number | null>(null);
  /** Sequence number of the latest full run: a preview asked for before it must not cover its result. */
  const lastFull = useRef(0);
  const warmRef = useRef(warmWith);
  const set = useRunStore((s) => s.set);

  useEffect(() => {
    // Without a scenario to warm with (a read-only reader), the workers are made only if a run is asked for.
    if (warmRef.current) {
      full.current = newWorker(warmRef.current);
      // The JavaScript engine optimises the integration over its first few runs (in Node the preview takes
      // ~390, 190, 110, 80 ms, then ~50 ms): the preview worker runs them before the first slider move.
      preview.current = newWorker(warmRef.current, PREVIEW_WARM_RUNS);
    }
    return () => {
      full.current?.terminate();
      preview.current?.terminate();
      full.current = null;
      preview.current = null;
      if (frameRequested.current !== null) cancelAnimationFrame(frameRequested.current);
    };
  }, []);

  /** A full run in flight is dropped: its worker is terminated and a fresh (warmed) one takes its place. */
  const dropFull = useCallback(() => {
    if (!fullBusy.current) return false;
    full.current?.terminate();
    full.current = newWorker(warmRef.current);
    fullBusy.current = false;
    return true;
  }, []);

  const runFull = useCallback(
    (scenario: Scenario): Promise<RunData | null> => {
      dropFull();
      if (!full.current) full.current = newWorker(null);
      const w = full.current;
      const id = ++seq.current;
      lastFull.current = id;
      pending.current = null;
      fullBusy.current = true;
      set({ status: "running", progress: 0, error: null, progressEvents: 0 });
      let events = 0;
      return new Promise((resolve) => {
        w.onmessage = (e: MessageEvent<WorkerMessage>) => {
          const m = e.data;
          if (m.type === "warm" || m.id !== id) return;
          if (m.type === "progress") set({ progress: m.fraction, progressEvents: ++events });
          else if (m.type === "done") {
            fullBusy.current = false;
            const data = toRunData(m.data, "browser");
            set({ status: "done", progress: 1, data, preview: null });
            resolve(data);
          } else {
            fullBusy.current = false;
            set({ status: "failed", error: m.message });
            resolve(null);
          }
        };
        w.onerror = (ev) => {
          fullBusy.current = false;
          set({ status: "failed", error: ev.message || "The run worker stopped with an error." });
          resolve(null);
        };
        w.postMessage({ type: "run", id, scenario, coarse: false } satisfies WorkerRequest);
      });
    },
    [set, dropFull],
  );

  const cancel = useCallback(() => {
    dropFull();
    set({ status: "cancelled" });
  }, [set, dropFull]);

  /** Sends the newest waiting preview when the preview worker is free. */
  const pump = useCallback(function pumpNext() {
    const job = pending.current;
    if (!job || previewInFlight.current) return;
    if (!preview.current) preview.current = newWorker(null);
    const w = preview.current;
    pending.current = null;
    const id = ++seq.current;
    previewInFlight.current = true;
    previewInput(id, job.input);
    w.onmessage = (e: MessageEvent<WorkerMessage>) => {
      const m = e.data;
      if (m.type === "warm" || m.id !== id) return;
      previewInFlight.current = false;
      const newer = !!pending.current;
      if (m.type === "done" && lastFull.current < id) {
        // Shown even when a newer value waits: during a drag the plots follow with the latest computed value.
        previewArrived(id, m.timing);
        const data: RunData = { ...toRunData(m.data, "preview"), previewId: id };
        previewUnpacked(id);
        set({ preview: data, previewBusy: newer });
      } else if (m.type === "done") {
        // A full run started since: keep its result on screen, but still say how long the preview took.
        set({ previewBusy: newer, previewLatencyMs: performance.now() - job.input });
      } else if (m.type === "error") set({ error: m.message, previewBusy: newer });
      pumpNext();
    };
    w.postMessage({ type: "run", id, scenario: job.scenario, coarse: true } satisfies WorkerRequest);
    previewSent(id);
    set({ previewBusy: true });
  }, [set]);

  /**
   * Queues a coarse preview of a slider value; `input` is the input event's timeStamp. A full run still
   * computing for an older value is superseded.
   */
  const runPreview = useCallback(
    (scenario: Scenario, input: number = performance.now()) => {
      pending.current = { scenario, input };
      if (dropFull() && useRunStore.getState().status === "running") set({ status: "idle", progress: 0 });
      if (frameRequested.current !== null) return; // this frame already sent one: the newest goes next frame
      pump();
      frameRequested.current = requestAnimationFrame(() => {
        frameRequested.current = null;
        pump();
      });
    },
    [pump, dropFull, set],
  );

  return { runFull, cancel, runPreview };
}
