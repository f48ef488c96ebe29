/**
 * Trend forecast: ordinary least-squares line through (time, value) (simple-statistics'
 * linearRegression), the date it reaches a level, and a 95 % interval for that date from the prediction
 * band of a single reading (inverse prediction, Draper & Smith, Applied Regression Analysis, ch. 3: the
 * dates where the band's edges cross the level). A reading at the level is what triggers the work, so the
 * band includes the readings' own scatter, not only the uncertainty of the line.
 *
 * No date is given (crossing null, `status` says why) from fewer than MIN_FORECAST_READINGS readings, from
 * a slope that is zero or not distinguishable from the scatter, or when the crossing lies beyond the
 * search window. Every date returned is a valid Date.
 */
import { linearRegression } from "simple-statistics";

const DAY = 86_400_000;
/** Largest time a JavaScript Date holds, ms either side of 1970 (ECMA-262 time value range). */
const MAX_TIME = 8.64e15;

/**
 * Readings needed before a forecast or a forecast alert: a line through n readings leaves n − 2 degrees of
 * freedom for the scatter; below three there is no scatter estimate at all (two readings give a zero-width
 * interval), and at three or four the 95 % factor t(0.975, n − 2) is 12.7 or 4.3, so the interval spans
 * years. From five (t = 3.18) the interval is wide but informative. The choice of five is an assumption.
 */
export const MIN_FORECAST_READINGS = 5;

export interface TrendPoint {
  at: Date;
  value: number;
}

/** Why a forecast has (or has no) crossing date. */
export type ForecastStatus = "dated" | "too-few" | "no-trend" | "away" | "beyond-window";

export interface Forecast {
  status: ForecastStatus;
  /** Slope per day and intercept at the first point's date. */
  slopePerDay: number;
  intercept: number;
  points: number;
  /** Residual standard deviation, in the value's unit (null below three points). */
  residualSd: number | null;
  /** When the line reaches the level (null: no date, see `status`). */
  crossing: Date | null;
  /** 95 % interval of the crossing date (null ends: not bounded inside the search window). */
  crossingEarliest: Date | null;
  crossingLatest: Date | null;
  /** Already at or past the level at the latest point. */
  reached: boolean;
  /** Search window, years after the latest reading. */
  searchYears: number;
  /** The fitted line and its band at a few dates, for the chart (empty below the minimum of readings). */
  line: { at: Date; value: number; lower: number; upper: number }[];
}

// Two-sided 95 % Student t quantiles t(0.975, df) for df = 1…30 (standard table); normal beyond.
const T975 = [12.706, 4.303, 3.182, 2.776, 2.571, 2.447, 2.365, 2.306, 2.262, 2.228, 2.201, 2.179, 2.16, 2.145, 2.131, 2.12, 2.11, 2.101, 2.093, 2.086, 2.08, 2.074, 2.069, 2.064, 2.06, 2.056, 2.052, 2.048, 2.045, 2.042];
export function t975(df: number): number {
  return df >= 1 && df <= 30 ? T975[df - 1] : 1.96;
}

/** A Date for t0 + x days, or null when that is not a representable date. */
function dateAt(t0: number, x: number | null): Date | null {
  if (x === null || !Number.isFinite(x)) return null;
  const t = t0 + x * DAY;
  return Number.isFinite(t) && Math.abs(t) <= MAX_TIME ? new Date(t) : null;
}

export function forecastCrossing(history: TrendPoint[], level: number, opts: { searchYears?: number } = {}): Forecast | null {
  const pts = history.filter((p) => Number.isFinite(p.value) && Number.isFinite(p.at.getTime())).sort((a, b) => a.at.getTime() - b.at.getTime());
  if (pts.length < 2 || !Number.isFinite(level)) return null;
  const searchYears = opts.searchYears ?? 20;
  const t0 = pts[0].at.getTime();
  const xs = pts.map((p) => (p.at.getTime() - t0) / DAY);
  const n = pts.length;
  const lastX = xs[n - 1];
  if (lastX <= 0) return null;
  const fit = linearRegression(pts.map((p, i) => [xs[i], p.value]));
  const b = fit.b;
  // Constant readings give a slope of rounding noise (1e-34/day): treat a change over the span below
  // a billionth of the values' scale as no slope at all.
  const scale = Math.max(Math.abs(level), ...pts.map((p) => Math.abs(p.value)), 1e-12);
  const m = Math.abs(fit.m * lastX) <= 1e-9 * scale ? 0 : fit.m;
  const xMean = xs.reduce((a, c) => a + c, 0) / n;
  const sxx = xs.reduce((a, c) => a + (c - xMean) ** 2, 0);
  const ssr = pts.reduce((a, p, i) => a + (p.value - (b + m * xs[i])) ** 2, 0);
  const sd = n >= 3 ? Math.sqrt(ssr / (n - 2)) : null;
  const tq = n >= 3 ? t975(n - 2) : 0;
  const reached = pts[n - 1].value >= level;
  const base = { slopePerDay: m, intercept: b, points: n, residualSd: sd, reached, searchYears };
  if (n < MIN_FORECAST_READINGS) return { ...base, status: "too-few", crossing: null, crossingEarliest: null, crossingLatest: null, line: [] };

  const half = (x: number) => (sd === null ? 0 : tq * sd * Math.sqrt(1 + 1 / n + (x - xMean) ** 2 / sxx));
  const lastFit = b + m * lastX;
  const rising = level >= lastFit;
  const toward = rising ? m > 0 : m < 0;
  // The slope's own 95 % interval includes zero: the readings show no trend beyond their scatter.
  const significant = sd === null || Math.abs(m) > tq * (sd / Math.sqrt(sxx));
  const endX = lastX + searchYears * 365.25;
  const rawX = toward && significant ? (level - b) / m : null;
  const crossingX = rawX !== null && rawX <= endX ? rawX : null;
  const status: ForecastStatus = m === 0 || !significant ? "no-trend" : !toward ? "away" : crossingX === null ? "beyond-window" : "dated";

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
  // Earliest: the band's near edge reaches the level; latest: its far edge does. Only around a dated crossing.
  const early = crossingX === null ? null : sd === null ? crossingX : firstRoot((x) => sign * (b + m * x - level) + half(x));
  const late = crossingX === null ? null : sd === null ? crossingX : firstRoot((x) => sign * (b + m * x - level) - half(x));
  const lineEnd = Math.max(lastX, Math.min(endX, crossingX !== null && crossingX > lastX ? crossingX * 1.1 : lastX * 1.2 + 30));
  const line = Array.from({ length: 25 }, (_, k) => {
    const x = xs[0] + ((lineEnd - xs[0]) * k) / 24;
    const v = b + m * x;
    return { at: dateAt(t0, x)!, value: v, lower: v - half(x), upper: v + half(x) };
  }).filter((p) => p.at !== null);
  return {
    ...base,
    status,
    crossing: dateAt(t0, crossingX),
    crossingEarliest: dateAt(t0, early),
    crossingLatest: dateAt(t0, late),
    line,
  };
}
