/**
 * Chain wear as elongation (pitch growth), not as lost stiffness: a chain worn by a fraction e is (1 + e) times
 * its new length on the same sprocket path. Its pitch and catch spacing grow by (1 + e), its E·A stays, and the
 * 2:1 take-up takes up the extra length e·L_loop in its two legs: the counterweight starts e·L_loop/2 lower.
 * Links taken out (`chain.linksRemoved`, n pitches of the worn chain) shorten the loop by n·p·(1 + e), and the
 * counterweight starts that much / 2 higher.
 */
import type { Scenario } from "./schema";

/** Sprocket path length of the loop, m: both strands and the bottom run (sim/loop.ts). */
export function loopPathLength(lift: { chainFrom: number; chainTo: number; bottomRun: number }): number {
  return 2 * (lift.chainTo - lift.chainFrom) + lift.bottomRun;
}

/** Extra drop of the counterweight at the start for a chain elongated by `elongation`, m. */
export function elongationDrop(lift: { chainFrom: number; chainTo: number; bottomRun: number }, elongation: number): number {
  return (elongation * loopPathLength(lift)) / 2;
}

/**
 * Net drop of the counterweight at the start for a chain elongated by `elongation` with `linksRemoved` pitches
 * (new pitch `pitch`) taken out, m; negative when more chain was removed than the wear added.
 */
export function wearDrop(
  lift: { chainFrom: number; chainTo: number; bottomRun: number },
  elongation: number,
  linksRemoved: number,
  pitch: number,
): number {
  return elongationDrop(lift, elongation) - (linksRemoved * pitch * (1 + elongation)) / 2;
}

/** The scenario the engine runs: chain wear applied to the pitch, catch spacing and take-up position. */
export function withElongation(s: Scenario): Scenario {
  const e = s.chain.elongation ?? 0;
  const n = s.chain.linksRemoved ?? 0;
  if (!(e > 0) && !(n > 0)) return s;
  return {
    ...s,
    chain: { ...s.chain, pitch: s.chain.pitch * (1 + e), catchSpacing: s.chain.catchSpacing * (1 + e) },
    takeUp: { ...s.takeUp, position: s.takeUp.position + wearDrop(s.lift, e, n, s.chain.pitch) },
  };
}
