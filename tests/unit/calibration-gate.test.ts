import { describe, expect, it } from "vitest";
import { MIN_R_SQUARED, fitVerdict } from "@/lib/calibration/gate";

const fit = (rSquared: number | null, converged: boolean, rms: number | null = 0.002) => ({ quality: { fitted: { rms, rSquared, samples: 300 } }, evaluations: 60, converged });

describe("calibration quality gate", () => {
  it("refuses the fit that would have dropped a lift's safety factor: R² below zero, stopped at the budget", () => {
    const v = fitVerdict(fit(-0.318, false, 0.012));
    expect(v.acceptable).toBe(false);
    const failing = v.findings.filter((f) => !f.ok).map((f) => f.text);
    expect(failing).toHaveLength(2);
    expect(failing[0]).toContain("worse than a flat line at the recording's average");
    expect(failing[1]).toContain("stopped at its budget of 60 engine runs");
  });

  it("passes a settled fit at or above the R² limit and reports the residual in the caller's unit", () => {
    // R² = 1 − SS_res/SS_tot (coefficient of determination, any regression text); 0.95 → 95 % accounted for.
    const v = fitVerdict(fit(0.95, true, 0.0025), (m) => `${(m / 0.0254).toFixed(3)} in`);
    expect(v.acceptable).toBe(true);
    expect(v.findings.map((f) => f.text).join(" ")).toContain("95 %");
    expect(v.findings.map((f) => f.text).join(" ")).toContain("0.098 in");
    expect(fitVerdict(fit(MIN_R_SQUARED, true)).acceptable).toBe(true);
  });

  it("refuses a loose fit, a settled search notwithstanding, and a fit with no measure", () => {
    expect(fitVerdict(fit(0.6, true)).acceptable).toBe(false);
    expect(fitVerdict(fit(0.99, false)).acceptable).toBe(false);
    expect(fitVerdict(fit(null, true, null)).acceptable).toBe(false);
  });
});
