/** Small helpers on sampled traces: linear interpolation, fit quality. Pure. */

/** Linear interpolation of (t, y) at time x; NaN outside the sampled span. */
export function interpolate(t: ArrayLike<number>, y: ArrayLike<number>, x: number): number {
  const n = t.length;
  if (n === 0 || x < t[0] || x > t[n - 1]) return Number.NaN;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (t[mid] <= x) lo = mid;
    else hi = mid;
  }
  if (hi === lo) return y[lo];
  const f = (x - t[lo]) / (t[hi] - t[lo] || 1);
  return y[lo] + f * (y[hi] - y[lo]);
}

export interface FitQuality {
  /** Root-mean-square residual, in the trace's unit (m). */
  rms: number;
  /** Coefficient of determination 1 − SS_res / SS_tot. */
  rSquared: number;
  /** Samples compared. */
  samples: number;
}

export function fitQuality(measured: number[], model: number[]): FitQuality {
  const n = measured.length;
  if (n === 0) return { rms: Number.NaN, rSquared: Number.NaN, samples: 0 };
  const mean = measured.reduce((a, b) => a + b, 0) / n;
  let ssRes = 0;
  let ssTot = 0;
  for (let i = 0; i < n; i++) {
    ssRes += (measured[i] - model[i]) ** 2;
    ssTot += (measured[i] - mean) ** 2;
  }
  return { rms: Math.sqrt(ssRes / n), rSquared: ssTot > 0 ? 1 - ssRes / ssTot : Number.NaN, samples: n };
}
