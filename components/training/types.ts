import type { Jsonify } from "@/lib/client/jsonify";
import type { SessionView } from "@/lib/training/service";

/** A training session as the API answers it. */
export type SessionJson = Jsonify<SessionView>;

/** The caption showing at time t: the latest one reached, for 5 s (or until the next one). */
export function activeCaption<T extends { at: number }>(captions: T[], t: number, hold = 5): T | null {
  let hit: T | null = null;
  for (const c of [...captions].sort((a, b) => a.at - b.at)) if (c.at <= t + 1e-6) hit = c;
  return hit && t - hit.at <= hold ? hit : null;
}

/**
 * A replay time as a new caption's time: to the hundredth of a second the replay shows, never below 0 nor past
 * the run's duration (the server refuses a caption beyond its run).
 */
export function pinnedAt(t: number, duration: number): number {
  const at = Math.round(Math.max(0, t) * 100) / 100;
  return duration > 0 ? Math.min(at, Math.floor(duration * 100) / 100) : at;
}
