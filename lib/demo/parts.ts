/** Pieces the demo park's lifts share (lib/demo/park.ts, lib/demo/thornwick.ts). */
import type { ChainSettings } from "@/sim/schema";

/** A demo section: the engine's fields, partly given (the format's defaults fill the rest). */
export type In<T> = Partial<T> & Record<string, unknown>;

/*
 * Chains: a breaking strength at or above ASME B29.1's minimum for the pitch (12,500·P² lbf, P in inches),
 * and E·A = 30 × breaking strength, the chain catalogue's assumption (lib/chains/standard.ts).
 * Emberline: 4 in pitch (No. 320 size: minimum 200,000 lbf = 890 kN), 1000 kN lift chain (invented), so the
 * steady climb's ≈ 103 kN stays within the working load of 1/7 of breaking strength (the check's default).
 */
export const EMBERLINE_CHAIN: In<ChainSettings> = {
  massPerLength: 15,
  axialStiffness: 3.0e7,
  breakingStrength: 1.0e6,
  pitch: 0.1016,
  catchSpacing: 2,
  catchOffset: 10,
  guideFriction: 0.12,
};
