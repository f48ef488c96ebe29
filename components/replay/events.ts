/**
 * The moments a replay's timeline marks, from the run's summary (per train: engagement, pick-up, dog release,
 * re-engagement after the release; the drive's stop and restart and the pick-up after it; the peak tension)
 * and ARD catches from each train's ARD force series. With several trains each label says which one.
 */
import type { Series, Summary, TrainSummary } from "@/sim";

export type EventKind = "engagement" | "ard" | "pickup" | "peak" | "stop" | "restart" | "release" | "reengage";

export interface RunEvent {
  kind: EventKind;
  t: number;
  label: string;
  /** Train index in scenario.trains, or null for the lift as a whole (peak, drive stop and restart). */
  train: number | null;
}

export const EVENT_LABELS: Record<EventKind, string> = {
  engagement: "Dog engages",
  ard: "ARD catch",
  pickup: "Pick-up",
  peak: "Peak tension",
  stop: "Drive stops",
  restart: "Drive restarts",
  release: "Dog release",
  reengage: "Dog re-engages after release",
};

export const PICKUP_AFTER_RESTART = "Pick-up after restart";

/** Times where the ARD force rises from zero (each a catch), from the even series. */
export function ardCatchTimes(series: { t: readonly number[]; ardForce: readonly number[] }): number[] {
  const out: number[] = [];
  let on = false;
  for (let i = 0; i < series.t.length; i++) {
    const f = series.ardForce[i] > 0;
    if (f && !on) out.push(series.t[i]);
    on = f;
  }
  return out;
}

/** What runEvents reads of the series: the time base, train 1's flat ARD force and each train's own. */
export type EventSeries = Pick<Series, "t" | "ardForce"> & { trains?: { ardForce: number[] }[] };

/** A summary stored before per-train figures existed describes train 1 in its flat keys. */
function trainsOf(summary: Summary): TrainSummary[] {
  return summary.trains?.length ? summary.trains : [summary];
}

const num = (x: number | null | undefined): x is number => typeof x === "number" && Number.isFinite(x);

/**
 * The events of a run in time order. `drive` (the scenario's drive settings) marks a stop and a restart
 * that no train's figures recorded (no train on the chain then); they are kept within the simulated time.
 */
export function runEvents(summary: Summary, series: EventSeries, drive?: { stop?: { time: number }; restart?: { time: number } }): RunEvent[] {
  const trains = trainsOf(summary);
  const many = trains.length > 1;
  const name = (label: string, j: number) => (many ? `Train ${j + 1}: ${label}` : label);
  const ev: RunEvent[] = [];
  const push = (kind: EventKind, t: number | null | undefined, label: string, train: number | null) => {
    if (num(t)) ev.push({ kind, t, label, train });
  };

  trains.forEach((tr, j) => {
    push("engagement", tr.engagementTime, name(EVENT_LABELS.engagement, j), j);
    if (num(tr.engagementTime) && num(tr.pickupDelay)) push("pickup", tr.engagementTime + tr.pickupDelay, name(EVENT_LABELS.pickup, j), j);
    const ard = series.trains?.[j]?.ardForce ?? (j === 0 ? series.ardForce : undefined);
    if (ard) for (const t of ardCatchTimes({ t: series.t, ardForce: ard })) push("ard", t, name(EVENT_LABELS.ard, j), j);
    const stop = tr.stop;
    if (stop && num(stop.restartTime) && num(stop.restartToPickup)) push("pickup", stop.restartTime + stop.restartToPickup, name(PICKUP_AFTER_RESTART, j), j);
    push("release", tr.release?.time ?? tr.dogReleaseTime, name(EVENT_LABELS.release, j), j);
    push("reengage", tr.release?.reengagedAt, name(EVENT_LABELS.reengage, j), j);
  });

  // The drive's stop and restart belong to the lift: once, from the first train that lived them.
  const stop = trains.find((tr) => tr.stop)?.stop ?? summary.stop ?? null;
  const end = num(summary.simulatedTime) ? summary.simulatedTime : Infinity;
  const stopAt = stop?.time ?? (drive?.stop && drive.stop.time <= end ? drive.stop.time : null);
  const restartAt = stop ? stop.restartTime : drive?.restart && drive.restart.time <= end ? drive.restart.time : null;
  push("stop", stopAt, EVENT_LABELS.stop, null);
  push("restart", restartAt, EVENT_LABELS.restart, null);
  push("peak", summary.peakTensionTime, EVENT_LABELS.peak, null);
  // Stable by time; at the same time, the lift's events after the trains'.
  return ev.map((e, i) => [e, i] as const).sort((a, b) => a[0].t - b[0].t || a[1] - b[1]).map(([e]) => e);
}
