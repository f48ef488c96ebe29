import { describe, expect, it } from "vitest";
import type { Check } from "@/sim/checks";
import { evaluateChecks } from "@/sim/checks";
import { coarserSegments, meshConfidence, runMeshConfidence, type MeshRun } from "@/sim/confidence";
import { simulate } from "@/sim/simulate";
import { designStatics } from "@/sim/statics";
import { scenario } from "./scenarios";
import type { Summary } from "@/sim/summary";

function run(segments: number, summary: Record<string, number | null>, checks: Partial<Check>[] = []): MeshRun {
  return { segments, summary: summary as unknown as Summary, checks: checks as Check[] };
}

describe("mesh confidence", () => {
  it("estimates the fine figure's error by Richardson's rule", () => {
    // Source: Richardson extrapolation, error of the fine solution ≈ (f_fine − f_coarse)/(r^p − 1) for a
    // refinement ratio r and order p (Roache, Verification and Validation in Computational Science and
    // Engineering, ch. 5). r = 2, p = 2: (101.7 − 101.4)/3 = 0.1 kN.
    const m = meshConfidence(run(60, { peakTension: 101_700 }), run(30, { peakTension: 101_400 }), { order: 2 });
    const f = m.figures.find((x) => x.key === "peakTension")!;
    expect(f.estimatedError!).toBeCloseTo(100, 9);
    expect(f.relativeChange!).toBeCloseTo(300 / 101_700, 12);
    expect(f.converged).toBe(true);
    expect(m.converged).toBe(true);
    expect(m.message).toMatch(/^Converged/);
  });

  it("says so when a verdict changes with the mesh instead of flipping silently", () => {
    // A snatch factor of 1.92 at 120 segments and 2.02 at 60 against a limit of 2: fail on one mesh only.
    const fine = run(120, { snatchFactor: 1.92 }, [{ key: "snatch", label: "Snatch factor", state: "pass", value: 1.92, limit: 2 }]);
    const coarse = run(60, { snatchFactor: 2.02 }, [{ key: "snatch", label: "Snatch factor", state: "fail", value: 2.02, limit: 2 }]);
    const m = meshConfidence(fine, coarse);
    expect(m.converged).toBe(false);
    expect(m.flipped).toEqual([{ key: "snatch", label: "Snatch factor", fine: "pass", coarse: "fail" }]);
    expect(m.marginal).toEqual(["snatch"]); // |1.92 − 2| ≤ |1.92 − 2.02| / (2 − 1)
    expect(m.message).toContain("Snatch factor: pass at 120, fail at 60 segments");
  });

  it("compares against half the segments, at least 4", () => {
    expect(coarserSegments(60)).toBe(30);
    expect(coarserSegments(5)).toBe(4);
  });

  it("runs the coarser mesh of a real run and compares", () => {
    const s = scenario({ run: { duration: 30, segments: 60 } });
    const checksOf = (sum: Parameters<typeof evaluateChecks>[0]) => evaluateChecks(sum, designStatics(s), s.limits);
    const r = simulate(s, { frameBudget: 0, series: false });
    const m = runMeshConfidence(s, { summary: r.summary, checks: checksOf(r.summary) }, checksOf);
    expect(m.fineSegments).toBe(r.summary.segments);
    expect(m.coarseSegments).toBeLessThan(m.fineSegments);
    // Source: mesh convergence of the engine (sim/README.md "Validation": doubling the segments changes peak
    // tension < 2 %).
    expect(m.figures.find((f) => f.key === "peakTension")!.relativeChange!).toBeLessThan(0.02);
    expect(m.message.length).toBeGreaterThan(20);
  });
});
