/**
 * Logbook arithmetic, SI and pure.
 * - Elongation over a measured span: (measured − n·p) / (n·p) × 100 %, p the nominal pitch (wear gauge
 *   practice: measure over many pitches so one link's tolerance does not dominate; common practice, no source).
 * - Links removed: the loop shortens by links × pitch; a 2:1 take-up moves half the chain's length change,
 *   so the weight rises by links × pitch / 2 (the same 2:1 rule the engine's statics use).
 */
export function elongationPercent(measuredLength: number, pitches: number, nominalPitch: number): number {
  const nominal = pitches * nominalPitch;
  return ((measuredLength - nominal) / nominal) * 100;
}

export interface TakeUpReset {
  /** Chain removed, m. */
  chainRemoved: number;
  /** How far the counterweight rises, m (half the chain removed). */
  rise: number;
  /** Expected position at rest afterwards, m below the top stop (null when no reading before). */
  expectedPosition: number | null;
}

export function takeUpReset(links: number, pitch: number, positionBefore: number | null): TakeUpReset {
  const chainRemoved = links * pitch;
  const rise = chainRemoved / 2;
  return { chainRemoved, rise, expectedPosition: positionBefore === null ? null : positionBefore - rise };
}

/**
 * Where the take-up at rest runs out of room: the bottom stop (travel below the top stop) less the room
 * a hot day needs (the statics' thermal part of the travel budget). Warning at `warningFraction` of it.
 */
export function takeUpLimits(travel: number, thermalReserve: number, warningFraction: number): { limit: number; warning: number } {
  const limit = Math.max(0, travel - thermalReserve);
  return { limit, warning: limit * warningFraction };
}
