import { describe, expect, it } from "vitest";
import { simulate } from "@/sim/simulate";
import { SimulationError } from "@/sim/errors";
import { scenario } from "./scenarios";

describe("odex and the fixed-step path agree", () => {
  it("on the example's pick-up (segments 30, first 20 s)", () => {
    // Reference: odex (Hairer, Nørsett & Wanner, §II.9) at rtol 1e-6 against velocity Verlet at half its
    // stability limit. Tolerance 1 % on peak tension and take-up drop, 2 % on the peak dog force (an impact
    // peak through the contact, the most step-sensitive figure: 1.2 % measured at the default step), 20 ms on
    // the engagement time.
    const s = scenario({ run: { duration: 20, segments: 30 } });
    const v = simulate(s, { integrator: "verlet", frameBudget: 0, sampleInterval: 0.05 });
    const o = simulate(s, { integrator: "odex", frameBudget: 0, sampleInterval: 0.05 });
    const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
    expect(rel(v.summary.peakTension, o.summary.peakTension)).toBeLessThan(0.01);
    expect(rel(v.summary.takeUpMaxDrop, o.summary.takeUpMaxDrop)).toBeLessThan(0.01);
    expect(rel(v.summary.peakDogForce, o.summary.peakDogForce)).toBeLessThan(0.02);
    expect(Math.abs(v.summary.engagementTime! - o.summary.engagementTime!)).toBeLessThan(0.02);
    expect(o.summary.energyResidual!).toBeLessThan(0.01);
    // Dense output gives the series on the exact grid.
    expect(o.series.t.length).toBe(v.series.t.length);
    expect(o.series.t[10]).toBeCloseTo(0.5, 9);
    const i = o.series.t.findIndex((t) => t >= 10);
    expect(Math.abs(o.series.trainPosition[i] - v.series.trainPosition[i])).toBeLessThan(0.01);
  });

  it("odex stops with a step-budget diagnostic instead of hanging", () => {
    const s = scenario({ run: { duration: 5, segments: 30, integrator: "odex" } });
    expect(() => simulate(s, { budget: { maxSteps: 50 } })).toThrowError(SimulationError);
    try {
      simulate(s, { budget: { maxSteps: 50 } });
    } catch (e) {
      expect((e as SimulationError).code).toBe("budget-steps");
    }
  });
});
