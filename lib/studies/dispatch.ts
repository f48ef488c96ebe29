/**
 * The dispatch study: trains sent up the lift one `interval` apart. Builds a case's trains and run length
 * from the scenario's first train, and reads from a case's figures whether the following train's pick-up
 * fell into the first train's release surge. Pure: no database, no engine run.
 */
import type { Scenario as EngineScenario, FieldIssue } from "@/sim/schema";
import type { Summary } from "@/sim/summary";

/** Longest run the engine accepts (run.duration), s. */
export const MAX_RUN_DURATION = 600;
/** Time added after the last train's estimated dog release so its release and surge are recorded, s (assumption). */
export const DISPATCH_RUN_MARGIN = 10;

/** Time a train needs to clear its own length carried at chain speed, s: the shortest interval a case accepts. */
export function clearingTime(s: EngineScenario): number {
  const t = s.trains[0];
  return (t.cars * t.carLength) / s.drive.speed;
}

/**
 * Estimated time from a train's appearance to its dog's release at the crest: the distance from its start to
 * the release point carried at chain speed, plus the drive's ramp (the train waits for no one else).
 */
export function crestTime(s: EngineScenario): number {
  const t = s.trains[0];
  const distance = Math.max(0, s.lift.dogRelease + t.dogOffset - t.startPosition);
  return distance / s.drive.speed + s.drive.rampTime;
}

/**
 * The scenario with trains one `interval` apart: train i at trains[0].startTime + i·interval (a second train
 * equal to the first is added to a one-train scenario), and a run long enough to carry the last train over the
 * crest (the scenario's duration is kept when it is longer). Refused in words when the interval is shorter than
 * the time the first train needs to clear its own length, or the run would be longer than the engine allows.
 */
export function dispatchScenario(
  base: EngineScenario,
  interval: number,
): { ok: true; scenario: EngineScenario } | { ok: false; issues: FieldIssue[] } {
  const s = structuredClone(base) as EngineScenario;
  const first = s.trains[0];
  const clear = clearingTime(s);
  if (interval < clear) {
    return {
      ok: false,
      issues: [
        {
          path: "dispatchInterval",
          message: `Dispatch interval ${interval} s is shorter than the ${clear.toFixed(1)} s the train needs to clear its own length at chain speed; it must be at least ${Math.ceil(clear * 10) / 10} s`,
        } as FieldIssue,
      ],
    };
  }
  const n = Math.max(2, s.trains.length);
  const t0 = first.startTime;
  const trains = [];
  for (let i = 0; i < n; i++) trains.push({ ...structuredClone(s.trains[i] ?? first), startTime: Number((t0 + i * interval).toPrecision(12)) });
  s.trains = trains;
  const needed = Math.ceil(t0 + (n - 1) * interval + crestTime(s) + DISPATCH_RUN_MARGIN);
  if (needed > MAX_RUN_DURATION) {
    return {
      ok: false,
      issues: [
        {
          path: "dispatchInterval",
          message: `Dispatch interval ${interval} s needs a run of ${needed} s to carry train ${n} over the crest; a run may last at most ${MAX_RUN_DURATION} s`,
        } as FieldIssue,
      ],
    };
  }
  s.run.duration = Math.max(s.run.duration, needed);
  return { ok: true, scenario: s };
}

/** The times a dispatch case is judged by, s (null when the run did not reach them). */
export interface DispatchTimes {
  /** The following train's pick-up: its first dog contact plus its load pick-up delay. */
  secondPickupTime: number | null;
  /** The first train's dog release at the crest. */
  firstReleaseTime: number | null;
  /** The first train's surge period over its steady climb. */
  surgePeriod: number | null;
  /** Whether the last train's dog released at the crest before the run ended. */
  lastTrainCrested: boolean | null;
}

export function dispatchTimes(summary: Pick<Summary, "trains">): DispatchTimes {
  const trains = summary.trains ?? [];
  if (trains.length < 2) return { secondPickupTime: null, firstReleaseTime: null, surgePeriod: null, lastTrainCrested: null };
  const [a, b] = trains;
  const last = trains[trains.length - 1];
  return {
    secondPickupTime: b.engagementTime === null ? null : b.engagementTime + (b.pickupDelay ?? 0),
    firstReleaseTime: a.release?.time ?? a.dogReleaseTime ?? null,
    surgePeriod: a.surgePeriod,
    lastTrainCrested: (last.release?.time ?? last.dogReleaseTime ?? null) !== null,
  };
}

/**
 * Whether the following train's pick-up coincides with the first train's release surge: the pick-up falls
 * within one surge period of the release (either side), where the chain still rings from the release. Null when
 * a time is missing (the run ended before it, or there is one train).
 */
export function pickupMeetsReleaseSurge(t: Pick<DispatchTimes, "secondPickupTime" | "firstReleaseTime" | "surgePeriod">): boolean | null {
  const { secondPickupTime: p, firstReleaseTime: r, surgePeriod: T } = t;
  if (p === null || r === null || T === null || !(T > 0)) return null;
  return Math.abs(p - r) <= T;
}
