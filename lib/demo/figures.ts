/**
 * Figures the demo scenarios are judged by, computed from a run's summary, series and inputs.
 * Summary figures are taken as they are; two are derived here because the summary does not hold them.
 */
export interface FigureSource {
  summary: Record<string, unknown>;
  series?: { t?: ArrayLike<number>; trainSpeed?: ArrayLike<number> };
  inputs: { drive: { speed: number }; takeUp: { travel: number; position: number } };
}

/**
 * Seconds from the dog's first contact until the train first moves at 95 % of chain speed: how long the
 * chain takes to pick the train up. Null when it never gets there.
 */
export function comeUpTime(src: FigureSource): number | null {
  const t0 = src.summary.engagementTime;
  const t = src.series?.t;
  const v = src.series?.trainSpeed;
  if (typeof t0 !== "number" || !t || !v) return null;
  const target = 0.95 * src.inputs.drive.speed;
  for (let i = 0; i < t.length; i++) if (t[i]! >= t0 && v[i]! >= target) return t[i]! - t0;
  return null;
}

/** Take-up travel left below the counterweight at its lowest, m (negative: it reached the stop). */
export function takeUpMargin(src: FigureSource): number | null {
  const drop = src.summary.takeUpMaxDrop;
  if (typeof drop !== "number") return null;
  return src.inputs.takeUp.travel - src.inputs.takeUp.position - drop;
}

/**
 * Seconds the second train is carried by the chain before the first train's dog lets go at the release: how
 * long both are on the chain. Null without a second train, an engagement or a release.
 */
export function dispatchOverlap(src: FigureSource): number | null {
  const trains = src.summary.trains as { engagementTime?: number | null; release?: { time: number } | null }[] | undefined;
  const released = trains?.[0]?.release?.time;
  const engaged = trains?.[1]?.engagementTime;
  return typeof released === "number" && typeof engaged === "number" ? released - engaged : null;
}

/** A summary figure by name or dotted path (e.g. "stop.rollback", "trains.1.engagementTime"), or a derived one above. */
export function figure(src: FigureSource, field: string): unknown {
  if (field === "comeUpTime") return comeUpTime(src);
  if (field === "takeUpMargin") return takeUpMargin(src);
  if (field === "dispatchOverlap") return dispatchOverlap(src);
  let v: unknown = src.summary;
  for (const k of field.split(".")) v = v && typeof v === "object" ? (v as Record<string, unknown>)[k] : undefined;
  return v;
}
