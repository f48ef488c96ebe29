import { describe, expect, it } from "vitest";
import {
  averageOver,
  dampingRatioFromDecrement,
  dominantPeriod,
  fitTrendSinusoids,
  logDecrement,
  periodAverage,
  positivePeaks,
} from "@/sim/signal";

/** Samples t = 0, dt, … up to T of f(t). */
function sample(T: number, dt: number, f: (t: number) => number) {
  const t: number[] = [];
  const y: number[] = [];
  for (let i = 0; i * dt <= T + 1e-12; i++) {
    t.push(i * dt);
    y.push(f(i * dt));
  }
  return { t, y };
}

describe("trend plus sinusoid", () => {
  // A creeping counterweight with a surge on top: y = y0 + r·t + A·sin(2πt/P + φ).
  const y0 = 0.4;
  const rate = -0.0131; // m/s
  const A = 0.35;
  const P = 2.2;
  const phi = 0.7;
  const { t, y } = sample(13.7, 0.01, (x) => y0 + rate * x + A * Math.sin((2 * Math.PI * x) / P + phi));

  it("least squares recovers the trend's slope and the amplitude", () => {
    // Source: linear least squares on the basis {1, t, cos ωt, sin ωt} is exact for a signal in that span
    // (Press et al., Numerical Recipes, §15.4 general linear least squares).
    const f = fitTrendSinusoids(t, y, [P])!;
    expect(f.slope).toBeCloseTo(rate, 9);
    expect(f.amplitudes[0]).toBeCloseTo(A, 9);
    expect(f.mean).toBeCloseTo(y0 + rate * 0.5 * (t[0] + t[t.length - 1]), 9);
    expect(f.residualRms).toBeLessThan(1e-9);
  });

  it("the dominant period is the spacing of upward zero crossings of the detrended signal", () => {
    // Source: the period of a sinusoid is the time between successive upward zero crossings (definition).
    expect(dominantPeriod(t, y)!).toBeCloseTo(P, 2);
  });

  it("an average over whole periods removes the swing", () => {
    // Source: ∫ sin over a whole period is 0, so the mean over [a, a + kP] is the trend's value at its middle.
    const a = 1.3;
    const b = a + 5 * P;
    expect(averageOver(t, y, a, b)).toBeCloseTo(y0 + rate * (a + b) / 2, 5);
    const m = periodAverage(t, y, P);
    const i = t.findIndex((x) => x >= 6);
    expect(m[i]).toBeCloseTo(y0 + rate * t[i], 5);
    expect(Number.isNaN(m[0])).toBe(true); // the window leaves the samples
  });
});

describe("logarithmic decrement", () => {
  it("gives ζ = δ/√(4π² + δ²) of a damped free vibration", () => {
    // Source: Rao, Mechanical Vibrations, §2.6.4: x(t) = X·e^(−ζωn·t)·sin(ωd·t + φ), successive peaks one damped
    // period τd = 2π/ωd apart, δ = ln(x1/x2) = 2πζ/√(1 − ζ²), so ζ = δ/√(4π² + δ²).
    const zeta = 0.03;
    const wn = 2 * Math.PI * 0.45;
    const wd = wn * Math.sqrt(1 - zeta * zeta);
    const { t, y } = sample(20, 0.005, (x) => 0.5 * Math.exp(-zeta * wn * x) * Math.sin(wd * x));
    const peaks = positivePeaks(t, y, 0.001).map((p) => p.value);
    expect(peaks.length).toBeGreaterThanOrEqual(8);
    const delta = logDecrement(peaks)!;
    expect(delta).toBeCloseTo((2 * Math.PI * zeta) / Math.sqrt(1 - zeta * zeta), 3);
    expect(dampingRatioFromDecrement(delta)).toBeCloseTo(zeta, 4);
  });

  it("is ln(x0/x1) for two peaks and null when it cannot be measured", () => {
    // Source: Rao, Mechanical Vibrations, eq. (2.84): δ = ln(x1/x2).
    expect(logDecrement([2, 1])).toBeCloseTo(Math.log(2), 12);
    expect(logDecrement([1])).toBeNull();
    expect(logDecrement([1, 0])).toBeNull();
  });
});
