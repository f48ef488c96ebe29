"use client";
/**
 * Client state of the run view (zustand): the result on screen, the what-if preview, the browser run's
 * progress. The replay's clock lives in components/replay/store.ts so the canvas can follow it without
 * re-rendering React.
 */
import { create } from "zustand";
import type { RunData, WhatIf } from "./types";

export type BrowserRunStatus = "idle" | "running" | "done" | "failed" | "cancelled";

interface RunState {
  data: RunData | null;
  preview: RunData | null;
  status: BrowserRunStatus;
  progress: number;
  error: string | null;
  whatIf: WhatIf | null;
  /** Milliseconds the last what-if preview took from slider move to figures. */
  previewLatencyMs: number | null;
  previewBusy: boolean;
  /** Progress messages received from the worker during the last browser run. */
  progressEvents: number;
  set(p: Partial<Omit<RunState, "set" | "reset">>): void;
  reset(p?: Partial<Omit<RunState, "set" | "reset">>): void;
}

const initial = {
  data: null,
  preview: null,
  status: "idle" as BrowserRunStatus,
  progress: 0,
  error: null,
  whatIf: null,
  previewLatencyMs: null,
  previewBusy: false,
  progressEvents: 0,
};

export const useRunStore = create<RunState>((set) => ({
  ...initial,
  set: (p) => set(p),
  reset: (p) => set({ ...initial, ...p }),
}));

/** What the figures, plots and replay show: the what-if preview while one is on screen, else the run. */
export function shownData(s: Pick<RunState, "data" | "preview">): RunData | null {
  return s.preview ?? s.data;
}
