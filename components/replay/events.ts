/** The moments a replay's timeline marks: engagement, ARD catches, pick-up, peak tension, dog release. */
import type { Series, Summary } from "@/sim";

export type EventKind = "engagement" | "ard" | "pickup" | "peak" | "release";

export interface RunEvent {
  kind: EventKind;
  t: number;
  label: string;
}

export const EVENT_LABELS: Record<EventKind, string> = {
  engagement: "Dog engages",
  ard: "ARD catch",
  pickup: "Pick-up",
  peak: "Peak tension",
  release: "Dog release",
};

/** Times where the ARD force rises from zero (each a catch), from the even series. */
export function ardCatchTimes(series: Pick<Series, "t" | "ardForce">): number[] {
  const out: number[] = [];
  let on = false;
  for (let i = 0; i < series.t.length; i++) {
    const f = series.ardForce[i] > 0;
    if (f && !on) out.push(series.t[i]);
    on = f;
  }
  return out;
}

export function runEvents(summary: Summary, series: Pick<Series, "t" | "ardForce">): RunEvent[] {
  const ev: RunEvent[] = [];
  if (summary.engagementTime !== null) ev.push({ kind: "engagement", t: summary.engagementTime, label: EVENT_LABELS.engagement });
  for (const t of ardCatchTimes(series)) ev.push({ kind: "ard", t, label: EVENT_LABELS.ard });
  if (summary.engagementTime !== null && summary.pickupDelay !== null)
    ev.push({ kind: "pickup", t: summary.engagementTime + summary.pickupDelay, label: EVENT_LABELS.pickup });
  ev.push({ kind: "peak", t: summary.peakTensionTime, label: EVENT_LABELS.peak });
  if (summary.dogReleaseTime !== null) ev.push({ kind: "release", t: summary.dogReleaseTime, label: EVENT_LABELS.release });
  return ev.sort((a, b) => a.t - b.t);
}
