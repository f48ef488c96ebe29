import { encodeResult } from "./result-format";

/** What simulate() returns, as far as storing it is concerned. */
export interface EngineResult {
  summary?: unknown;
  diagnostics?: unknown;
  [key: string]: unknown;
}

export interface PackedResult {
  summary: Record<string, unknown>;
  diagnostics: Record<string, unknown>;
  /** gzipped tautline-result/1: everything except summary and diagnostics (series, frames, notes). */
  blob: Uint8Array;
}

/** Splits an engine result into the run's JSON columns and its result blob (worker threads and the seed). */
export function packEngineResult(result: EngineResult): PackedResult {
  const { summary, diagnostics, ...rest } = result;
  return {
    summary: (summary ?? {}) as Record<string, unknown>,
    diagnostics: (diagnostics ?? {}) as Record<string, unknown>,
    blob: encodeResult(rest),
  };
}
