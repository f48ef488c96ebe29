import { describe, expect, it } from "vitest";
import { nelderMead } from "@/lib/calibration/nelder-mead";
import { fitQuality, interpolate } from "@/lib/calibration/trace";

describe("Nelder–Mead", () => {
  it("finds the minimum of Rosenbrock's valley", () => {
    // Source: Rosenbrock (1960), f(x, y) = (1 − x)² + 100 (y − x²)², minimum 0 at (1, 1).
    const f = ([x, y]: number[]) => (1 - x) ** 2 + 100 * (y - x * x) ** 2;
    const r = nelderMead(f, [-1.2, 1], { maxEvaluations: 2000, xTolerance: 1e-9, fTolerance: 1e-14, step: 0.5 });
    expect(r.x[0]).toBeCloseTo(1, 4);
    expect(r.x[1]).toBeCloseTo(1, 4);
    expect(r.fx).toBeLessThan(1e-8);
  });

  it("finds the centre of a shifted quadratic bowl in three dimensions", () => {
    // A quadratic Σ wᵢ (xᵢ − cᵢ)² has its only minimum at c (by construction).
    const c = [3, -2, 0.5];
    const f = (x: number[]) => x.reduce((a, xi, i) => a + (i + 1) * (xi - c[i]) ** 2, 0);
    const r = nelderMead(f, [0, 0, 0], { maxEvaluations: 3000, xTolerance: 1e-8 });
    r.x.forEach((xi, i) => expect(xi).toBeCloseTo(c[i], 5));
    expect(r.converged).toBe(true);
  });

  it("treats a non-finite value as worse than any finite one", () => {
    const f = ([x]: number[]) => (x < 0 ? Number.NaN : (x - 2) ** 2);
    const r = nelderMead(f, [0.1], { maxEvaluations: 500 });
    expect(r.x[0]).toBeCloseTo(2, 4);
  });

  it("stops at the evaluation budget", () => {
    let n = 0;
    nelderMead((x) => (n++, x[0] ** 2 + x[1] ** 2), [5, 5], { maxEvaluations: 25, xTolerance: 0 });
    expect(n).toBeLessThanOrEqual(27); // a shrink may finish its vertices
  });
});

describe("trace helpers", () => {
  it("interpolates linearly and refuses times outside the span", () => {
    expect(interpolate([0, 1, 2], [0, 10, 30], 1.5)).toBe(20);
    expect(Number.isNaN(interpolate([0, 1], [0, 1], 2))).toBe(true);
  });

  it("gives R² = 1 for a perfect fit and the RMS of a constant offset", () => {
    expect(fitQuality([1, 2, 3], [1, 2, 3]).rSquared).toBe(1);
    expect(fitQuality([1, 2, 3], [1.5, 2.5, 3.5]).rms).toBeCloseTo(0.5, 12);
  });
});
