/**
 * Which alerts a lift's logbook raises: a latest reading at or past a warning or limit level, or a
 * forecast crossing of the limit inside the horizon. Pure.
 */
export interface AlertCandidate {
  kind: "elongation-limit" | "elongation-warning" | "elongation-forecast" | "take-up-limit" | "take-up-warning" | "take-up-forecast";
  level: "warning" | "limit" | "forecast";
  message: string;
}

export interface AlertInputs {
  liftName: string;
  now: Date;
  horizonDays: number;
  elongation: { latest: number | null; warning: number; limit: number; forecast: Date | null };
  takeUp: { latest: number | null; warning: number; limit: number; forecast: Date | null };
}

const pct = (v: number) => `${v.toFixed(2)} %`;
const mm = (v: number) => `${Math.round(v * 1000)} mm`;
const day = (d: Date) => d.toISOString().slice(0, 10);

export function evaluateAlerts(x: AlertInputs): AlertCandidate[] {
  const out: AlertCandidate[] = [];
  const horizonEnd = x.now.getTime() + x.horizonDays * 86_400_000;
  const e = x.elongation;
  if (e.latest !== null && e.latest >= e.limit)
    out.push({ kind: "elongation-limit", level: "limit", message: `${x.liftName}: chain elongation ${pct(e.latest)} has reached the replacement limit of ${pct(e.limit)}.` });
  else if (e.latest !== null && e.latest >= e.warning)
    out.push({ kind: "elongation-warning", level: "warning", message: `${x.liftName}: chain elongation ${pct(e.latest)} is past the warning level of ${pct(e.warning)} (limit ${pct(e.limit)}).` });
  if (e.forecast && (e.latest === null || e.latest < e.limit) && e.forecast.getTime() <= horizonEnd)
    out.push({ kind: "elongation-forecast", level: "forecast", message: `${x.liftName}: the elongation trend reaches the ${pct(e.limit)} limit around ${day(e.forecast)}, inside the ${x.horizonDays}-day horizon.` });
  const t = x.takeUp;
  if (t.latest !== null && t.latest >= t.limit)
    out.push({ kind: "take-up-limit", level: "limit", message: `${x.liftName}: the take-up at rest is ${mm(t.latest)} below the top stop, at the end of its usable travel (${mm(t.limit)}).` });
  else if (t.latest !== null && t.latest >= t.warning)
    out.push({ kind: "take-up-warning", level: "warning", message: `${x.liftName}: the take-up at rest is ${mm(t.latest)} below the top stop, past the warning level of ${mm(t.warning)} (usable travel ${mm(t.limit)}).` });
  if (t.forecast && (t.latest === null || t.latest < t.limit) && t.forecast.getTime() <= horizonEnd)
    out.push({ kind: "take-up-forecast", level: "forecast", message: `${x.liftName}: the take-up trend runs out of travel around ${day(t.forecast)}, inside the ${x.horizonDays}-day horizon.` });
  return out;
}
