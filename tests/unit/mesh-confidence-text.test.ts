import { describe, expect, it } from "vitest";
import { meshConfidence } from "@/sim/confidence";
import type { Summary } from "@/sim/summary";
import { meshLine } from "@/lib/runs/mesh";
import { operatingWindow } from "@/lib/studies/window";
import type { StudyParameter } from "@/lib/studies/schema";

const summary = (peakTension: number) => ({ peakTension }) as unknown as Summary;

describe("mesh confidence in words", () => {
  it("names the figure and how far it moves at the coarser mesh", () => {
    // Source: arithmetic, |100 kN − 95 kN| / 100 kN = 5.0 %, above the 2 % tolerance.
    const mc = meshConfidence({ segments: 60, summary: summary(100_000), checks: [] }, { segments: 30, summary: summary(95_000), checks: [] });
    const line = meshLine(mc);
    expect(line.converged).toBe(false);
    expect(line.text).toBe("not converged: peak tension moves 5.0 % at a coarser mesh");
    expect(line.detail).toContain("60 segments against 30");
  });

  it("says converged when every figure stays within the tolerance", () => {
    // Source: arithmetic, |100 kN − 99.5 kN| / 100 kN = 0.5 % < 2 %.
    const mc = meshConfidence({ segments: 60, summary: summary(100_000), checks: [] }, { segments: 30, summary: summary(99_500), checks: [] });
    expect(meshLine(mc).text).toBe("converged");
  });
});

describe("a study window with a verdict that is not settled on the mesh", () => {
  const speed: StudyParameter = { key: "entrySpeed", range: { from: 1, to: 3, step: 1 } };
  it("states the case instead of flipping silently", () => {
    const w = operatingWindow([speed], [
      { values: { entrySpeed: 1 }, status: "done", acceptable: true, meshSettled: true },
      { values: { entrySpeed: 2 }, status: "done", acceptable: true, meshSettled: false },
      { values: { entrySpeed: 3 }, status: "done", acceptable: false, meshSettled: true },
    ]);
    expect(w.groups[0].intervals).toEqual([[1, 2]]);
    expect(w.unsettled).toEqual([{ entrySpeed: 2 }]);
    expect(w.text).toContain("Not settled on the mesh");
    expect(w.text).toContain("entry speed 2.00 m/s");
  });
  it("adds nothing when every verdict is settled or not measured", () => {
    const w = operatingWindow([speed], [
      { values: { entrySpeed: 1 }, status: "done", acceptable: true, meshSettled: null },
      { values: { entrySpeed: 2 }, status: "done", acceptable: true },
      { values: { entrySpeed: 3 }, status: "done", acceptable: true, meshSettled: true },
    ]);
    expect(w.unsettled).toEqual([]);
    expect(w.text).not.toContain("mesh");
  });
});
