/** What a run looks like in the browser, whichever way it was made (Web Worker or a saved server run). */
import type { Check, Frame, Layout, MeshConfidence, Scenario, Series, Summary } from "@/sim";
import type { PackedSeries } from "./compute";
import type { WorkerTiming } from "./previewTiming";

export interface RunData {
  scenario: Scenario;
  summary: Summary;
  series: Series;
  frames: Frame[];
  layout: Layout;
  notes: string[];
  checks: Check[];
  /** Where it came from: a browser run, a coarse what-if preview, or a saved server run. */
  origin: "browser" | "preview" | "server";
  runId?: number;
  /** A what-if preview's request number (its timing record in previewTiming.ts). */
  previewId?: number;
  /** Wall time of the simulation itself, ms. */
  wallTimeMs: number;
  /** Saved runs: the figures against a coarser mesh (null when the run was stored without it). */
  meshConfidence?: MeshConfidence | null;
  /** Why a saved run holds no mesh confidence (e.g. its budget ran out), when it says. */
  meshError?: string | null;
}

/** Settings the what-if sliders change on top of the scenario (SI). */
export interface WhatIf {
  entrySpeed: number;
  chainSpeed: number;
  takeUpMass: number;
}

/**
 * A run, or a warm-up: `runs` previews of the scenario whose results are dropped, so the engine is loaded and
 * compiled by the JavaScript engine's optimiser before the first real request (a real request ends it).
 */
export type WorkerRequest = { type: "run"; id: number; scenario: Scenario; coarse: boolean } | { type: "warm"; scenario: Scenario; runs: number };

/** A result as the worker sends it: the series packed into one transferred Float64Array. */
export type WorkerResult = Omit<RunData, "origin" | "series"> & { packed: PackedSeries };

export type WorkerMessage =
  | { type: "progress"; id: number; fraction: number }
  | { type: "done"; id: number; data: WorkerResult; timing: WorkerTiming }
  | { type: "error"; id: number; message: string; code?: string }
  | { type: "warm" };
