/** What a run looks like in the browser, whichever way it was made (Web Worker or a saved server run). */
import type { Check, Frame, Layout, MeshConfidence, Scenario, Series, Summary } from "@/sim";

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

export interface WorkerRequest {
  id: number;
  scenario: Scenario;
  /** Coarse preview: fewer segments, fewer frames, coarser series. */
  coarse: boolean;
}

export type WorkerMessage =
  | { type: "progress"; id: number; fraction: number }
  | { type: "done"; id: number; data: Omit<RunData, "origin"> }
  | { type: "error"; id: number; message: string; code?: string };
