/**
 * Trend forecast: ordinary least-squares line through (time, value) (simple-statistics'
 * linearRegression), the date it reaches a level, and a 95 % interval for that date from the line's
 * confidence band (inverse prediction, as in Draper & Smith, Applied Regression Analysis, ch. 3: the
 * dates where the band's edges cross the level). With fewer than three points there is no interval.
 */
import { linearRegression } from "simple-statistics";

const DAY = 86_400_000;

export interface TrendPoint {
  at: Date;
  value: number;
}

export interface Forecast {
  /** Slope per day and intercept at the first point's date. */
  slopePerDay: number;
  intercept: number;
  points: number;
  /** Residual standard deviation, in the value's unit (null below three points). */
  residualSd: number | null;
  /** When the line reaches the level (null: never, i.e. flat or going away from it). */
  crossing: Date | null;
  /** 95 % interval of the crossing date (null ends: not bounded inside the search window). */
  crossingEarliest: Date | null;
  crossingLatest: Date | null;
  /** Already at or past the level at the latest point. */
  reached: boolean;
  /** The fitted line and its band at a few dates, for the chart. */
  line: { at: Date; value: number; lower: number; upper: number }[];
}

// Two-sided 95 % Student t quantiles t(0.975, df) for df = 1…30 (standard table); normal beyond.
const T975 = [12.706, 4.303, 3.182, 2.776, 2.571, 2.447, 2.365, 2.306, 2.262, 2.228, 2.201, 2.179, 2.16, 2.145, 2.131, 2.12, 2.11, 2.101, 2.093, 2.086, 2.08, 2.074, 2.069, 2.064, 2.06, 2.056, 2.052, 2.048, 2.045, 2.042];
export function t975(df: number): number {
  return df >= 1 && df <= 30 ? T975[df - 1] : 1.96;
}

export function forecastCrossing(history: TrendPoint[], level: number, opts: { searchYears?: number } = {}): Forecast | null {
  const pts = [...history].sort((a, b) => a.at.getTime() - b.at.getTime());
  if (pts.length < 2) return null;
  const t0 = pts[0].at.getTime();
  const xs = pts.map((p) => (p.at.getTime() - t0) / DAY);
  if (xs[xs.length - 1] - xs[0] <= 0) return null;
  const { m, b } = linearRegression(pts.map((p, i) => [xs[i], p.value]));
  const n = pts.length;
  const xMean = xs.reduce((a, c) => a + c, 0) / n;
  const sxx = xs.reduce((a, c) => a + (c - xMean) ** 2, 0);
  const ssr = pts.reduce((a, p, i) => a + (p.value - (b + m * xs[i])) ** 2, 0);
  const sd = n >= 3 ? Math.sqrt(ssr / (n - 2)) : null;
  const tq = n >= 3 ? t975(n - 2) : 0;
  const half = (x: number) => (sd === null ? 0 : tq * sd * Math.sqrt(1 / n + (x - xMean) ** 2 / sxx));
  const lastX = xs[n - 1];
  const lastFit = b + m * lastX;
  const rising = level >= lastFit;
  const reached = pts[n - 1].value >= level;
  const toward = rising ? m > 0 : m < 0;
  const crossingX = toward ? (level - b) / m : null;
  const endX = lastX + (opts.searchYears ?? 20) * 365.25;
  // First x in the window where f(x) ≥ 0: scan, then bisect the bracketing step.
  const firstRoot = (f: (x: number) => number): number | null => {
    const steps = 400;
    let xa = xs[0];
    if (f(xa) >= 0) return xa;
    for (let k = 1; k <= steps; k++) {
      let xb = xs[0] + ((endX - xs[0]) * k) / steps;
      if (f(xb) >= 0) {
        for (let j = 0; j < 60; j++) {
          const mid = (xa + xb) / 2;
          if (f(mid) >= 0) xb = mid;
          else xa = mid;
        }
        return xb;
      }
      xa = xb;
    }
    return null;
  };
  const sign = rising ? 1 : -1;
  // Earliest: the band's near edge reaches the level; latest: its far edge does.
  const early = sd === null ? crossingX : firstRoot((x) => sign * (b + m * x - level) + half(x));
  const late = sd === null ? crossingX : firstRoot((x) => sign * (b + m * x - level) - half(x));
  const date = (x: number | null) => (x === null || !Number.isFinite(x) ? null : new Date(t0 + x * DAY));
  const lineEnd = Math.max(lastX, Math.min(endX, crossingX !== null && crossingX > lastX ? crossingX * 1.1 : lastX * 1.2 + 30));
  const line = Array.from({ length: 25 }, (_, k) => {
    const x = xs[0] + ((lineEnd - xs[0]) * k) / 24;
    const v = b + m * x;
    return { at: new Date(t0 + x * DAY), value: v, lower: v - half(x), upper: v + half(x) };
  });
  return {
    slopePerDay: m,
    intercept: b,
    points: n,
    residualSd: sd,
    crossing: date(crossingX),
    crossingEarliest: date(early),
    crossingLatest: date(late),
    reached,
    line,
  };
}
