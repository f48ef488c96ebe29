/**
 * Signal analysis for run figures (pure): averages over whole periods, least-squares fits of a trend plus
 * sinusoids, period detection and the logarithmic decrement. Samples may be unevenly spaced; integrals use
 * the trapezoid rule.
 */

/** Time average of y over [a, b] (trapezoid rule with linear interpolation at the ends). */
export function averageOver(t: ArrayLike<number>, y: ArrayLike<number>, a: number, b: number): number {
  if (!(b > a)) return NaN;
  let area = 0;
  for (let i = 0; i + 1 < t.length; i++) {
    const t0 = Math.max(a, t[i]);
    const t1 = Math.min(b, t[i + 1]);
    if (t1 <= t0) continue;
    const h = t[i + 1] - t[i];
    const at = (tt: number) => (h > 0 ? y[i] + ((y[i + 1] - y[i]) * (tt - t[i])) / h : y[i]);
    area += 0.5 * (at(t0) + at(t1)) * (t1 - t0);
  }
  return area / (b - a);
}

/**
 * Centred moving average over one period P: m(t) = (1/P)∫ y over [t − P/2, t + P/2]. A sinusoid of period P
 * (or P/k) averages to zero, so what is left is the trend. NaN where the window leaves the samples.
 */
export function periodAverage(t: ArrayLike<number>, y: ArrayLike<number>, period: number): number[] {
  const n = t.length;
  const out = new Array<number>(n).fill(NaN);
  if (n < 2 || !(period > 0)) return out;
  // Cumulative trapezoid integral, then the window by linear interpolation of it.
  const c = new Float64Array(n);
  for (let i = 1; i < n; i++) c[i] = c[i - 1] + 0.5 * (y[i] + y[i - 1]) * (t[i] - t[i - 1]);
  const integral = (tt: number, hint: number) => {
    let j = hint;
    while (j + 1 < n - 1 && t[j + 1] < tt) j++;
    while (j > 0 && t[j] > tt) j--;
    const h = t[j + 1] - t[j];
    const f = h > 0 ? (tt - t[j]) / h : 0;
    // Exact for a piecewise-linear y: c(t_j) + ∫ from t_j to tt of the linear piece.
    return { v: c[j] + (tt - t[j]) * (y[j] + 0.5 * f * (y[j + 1] - y[j])), j };
  };
  let ja = 0;
  let jb = 0;
  for (let i = 0; i < n; i++) {
    const a = t[i] - period / 2;
    const b = t[i] + period / 2;
    if (a < t[0] - 1e-12 || b > t[n - 1] + 1e-12) continue;
    const A = integral(Math.max(a, t[0]), ja);
    const B = integral(Math.min(b, t[n - 1]), jb);
    ja = A.j;
    jb = B.j;
    out[i] = (B.v - A.v) / period;
  }
  return out;
}

/** Solves A·x = b (n×n, row-major) by Gaussian elimination with partial pivoting; null when singular. */
function solve(A: number[][], b: number[]): number[] | null {
  const n = b.length;
  const M = A.map((row, i) => [...row, b[i]]);
  for (let k = 0; k < n; k++) {
    let p = k;
    for (let i = k + 1; i < n; i++) if (Math.abs(M[i][k]) > Math.abs(M[p][k])) p = i;
    if (!(Math.abs(M[p][k]) > 1e-300)) return null;
    [M[k], M[p]] = [M[p], M[k]];
    for (let i = k + 1; i < n; i++) {
      const f = M[i][k] / M[k][k];
      for (let j = k; j <= n; j++) M[i][j] -= f * M[k][j];
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let i = n - 1; i >= 0; i--) {
    let s = M[i][n];
    for (let j = i + 1; j < n; j++) s -= M[i][j] * x[j];
    x[i] = s / M[i][i];
  }
  return x;
}

export interface TrendSinusoidFit {
  /** Value of the trend at the window's mid-time. */
  mean: number;
  /** Slope of the trend, per second. */
  slope: number;
  /** Amplitude of each sinusoid, in the order of the periods given. */
  amplitudes: number[];
  /** Root-mean-square of what the fit leaves. */
  residualRms: number;
}

/**
 * Least squares of y ≈ a + b·(t − t_m) + Σ_k [c_k·cos(2πt/P_k) + d_k·sin(2πt/P_k)] over the samples, with
 * t_m the mid-time (keeps the normal equations well conditioned). With no periods it is a straight line.
 */
export function fitTrendSinusoids(t: ArrayLike<number>, y: ArrayLike<number>, periods: readonly number[] = []): TrendSinusoidFit | null {
  const n = t.length;
  const ps = periods.filter((p) => p > 0 && Number.isFinite(p));
  const m = 2 + 2 * ps.length;
  if (n < m + 1) return null;
  const tm = 0.5 * (t[0] + t[n - 1]);
  const A = Array.from({ length: m }, () => new Array<number>(m).fill(0));
  const rhs = new Array<number>(m).fill(0);
  const row = new Array<number>(m);
  const basis = (ti: number) => {
    row[0] = 1;
    row[1] = ti - tm;
    ps.forEach((p, k) => {
      const w = (2 * Math.PI) / p;
      row[2 + 2 * k] = Math.cos(w * (ti - tm));
      row[3 + 2 * k] = Math.sin(w * (ti - tm));
    });
    return row;
  };
  for (let i = 0; i < n; i++) {
    const r = basis(t[i]);
    for (let a = 0; a < m; a++) {
      rhs[a] += r[a] * y[i];
      for (let b = 0; b < m; b++) A[a][b] += r[a] * r[b];
    }
  }
  const x = solve(A, rhs);
  if (!x) return null;
  let ss = 0;
  for (let i = 0; i < n; i++) {
    const r = basis(t[i]);
    let f = 0;
    for (let a = 0; a < m; a++) f += r[a] * x[a];
    ss += (y[i] - f) ** 2;
  }
  return {
    mean: x[0],
    slope: x[1],
    amplitudes: ps.map((_, k) => Math.hypot(x[2 + 2 * k], x[3 + 2 * k])),
    residualRms: Math.sqrt(ss / n),
  };
}

/** y minus its least-squares straight line. */
export function detrend(t: ArrayLike<number>, y: ArrayLike<number>): number[] {
  const f = fitTrendSinusoids(t, y);
  const n = t.length;
  if (!f) return Array.from(y as ArrayLike<number>);
  const tm = 0.5 * (t[0] + t[n - 1]);
  return Array.from({ length: n }, (_, i) => y[i] - f.mean - f.slope * (t[i] - tm));
}

/** Times at which y crosses zero upwards (linear interpolation), with a hysteresis band ±h against noise. */
export function upwardCrossings(t: ArrayLike<number>, y: ArrayLike<number>, h = 0): number[] {
  const out: number[] = [];
  let armed = false; // been below −h since the last crossing
  for (let i = 0; i < t.length; i++) {
    if (y[i] < -h) armed = true;
    if (armed && i > 0 && y[i - 1] < 0 && y[i] >= 0) {
      const f = -y[i - 1] / (y[i] - y[i - 1]);
      out.push(t[i - 1] + f * (t[i] - t[i - 1]));
      armed = false;
    }
  }
  return out;
}

/**
 * The dominant period of an oscillation about a trend: the mean spacing of upward zero crossings of the
 * detrended signal (hysteresis 10 % of its largest excursion). Null with fewer than two whole cycles.
 */
export function dominantPeriod(t: ArrayLike<number>, y: ArrayLike<number>): number | null {
  const d = detrend(t, y);
  let big = 0;
  for (const v of d) big = Math.max(big, Math.abs(v));
  if (!(big > 0)) return null;
  const c = upwardCrossings(t, d, 0.1 * big);
  if (c.length < 3) return null;
  return (c[c.length - 1] - c[0]) / (c.length - 1);
}

/** Damping ratio from the logarithmic decrement δ: ζ = δ / √(4π² + δ²) (Rao, Mechanical Vibrations). */
export function dampingRatioFromDecrement(delta: number): number {
  return delta / Math.sqrt(4 * Math.PI * Math.PI + delta * delta);
}

/**
 * Logarithmic decrement of a free decay from its successive positive peaks x_0, x_1, … one period apart:
 * δ = −slope of ln x_i against i by least squares (for two peaks, ln(x_0/x_1); Rao). Null with fewer than
 * two peaks or a non-positive peak.
 */
export function logDecrement(peaks: readonly number[]): number | null {
  const n = peaks.length;
  if (n < 2 || peaks.some((p) => !(p > 0))) return null;
  let si = 0;
  let sl = 0;
  let sii = 0;
  let sil = 0;
  peaks.forEach((p, i) => {
    const l = Math.log(p);
    si += i;
    sl += l;
    sii += i * i;
    sil += i * l;
  });
  const slope = (n * sil - si * sl) / (n * sii - si * si);
  return -slope;
}

/**
 * The largest value of y in each positive lobe (from an upward zero crossing until y falls below −h), one per
 * cycle; a lobe must rise above +h and be followed by a fall below −h to count (hysteresis against ripple).
 */
export function positivePeaks(t: ArrayLike<number>, y: ArrayLike<number>, h = 0): { t: number; value: number }[] {
  const out: { t: number; value: number }[] = [];
  let inLobe = false;
  let best = -Infinity;
  let bestT = 0;
  let armed = false;
  for (let i = 0; i < t.length; i++) {
    const v = y[i];
    if (!Number.isFinite(v)) continue;
    if (v < -h) {
      if (inLobe && best > h) out.push({ t: bestT, value: best });
      inLobe = false;
      armed = true;
      continue;
    }
    if (armed && v >= 0 && !inLobe) {
      inLobe = true;
      best = -Infinity;
    }
    if (inLobe && v > best) {
      best = v;
      bestT = t[i];
    }
  }
  return out;
}
