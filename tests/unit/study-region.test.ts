import { describe, expect, it } from "vitest";
import { contourSegments } from "@/components/study/contours";
import { axisTitle, describeRegion, studyRegion, utilisationOf } from "@/lib/studies/region";
import type { StudyParameter } from "@/lib/studies/schema";

// Entry speed 1.0–3.0 m/s (5 values) × take-up mass 1000–3000 kg (3 values). The snatch factor (limit 2.0)
// rises with entry speed and is worse with the light weight: it fails at 2.5 and 3.0 m/s with 1000 kg.
// At 2.0 m/s with 2000 kg a rollback check fails alone (0.6 m against 0.5 m): a hole in the window.
const params: StudyParameter[] = [
  { key: "entrySpeed", range: { from: 1, to: 3, step: 0.5 } },
  { key: "takeUpMass", values: [1000, 2000, 3000] },
];
function cases() {
  const out = [];
  for (const v of [1, 1.5, 2, 2.5, 3])
    for (const m of [1000, 2000, 3000]) {
      const snatch = 1.2 + 0.35 * (v - 1) + (m === 1000 ? 0.3 : 0);
      const hole = v === 2 && m === 2000;
      const checks = [
        { key: "snatch", label: "Snatch factor", state: snatch > 2 ? "fail" : snatch > 1.6 ? "caution" : "pass", value: snatch, limit: 2 },
        { key: "rollback", label: "Rollback and ARD catches", state: hole ? "fail" : "pass", value: hole ? 0.6 : 0, limit: 0.5 },
        { key: "safetyFactor", label: "Chain safety factor", state: "pass", value: 8, limit: 5 },
      ];
      out.push({ values: { entrySpeed: v, takeUpMass: m }, status: "done", checks });
    }
  return out;
}

describe("operating region", () => {
  it("finds the largest connected safe region, its margin and the hole with the check that fails there", () => {
    const r = studyRegion(params, cases())!;
    expect(r.governing).toEqual({ key: "snatch", label: "Snatch factor" });
    expect(r.cells.flat().filter((c) => c.state === "fail")).toHaveLength(3);
    expect(r.window!.cells).toHaveLength(12);
    expect(r.window!.xRange).toEqual([1, 3]);
    expect(r.window!.yRange).toEqual([1000, 3000]);
    expect(r.window!.rectangular).toBe(false);
    expect(r.holes).toEqual([
      { x: 2.5, y: 1000, why: "Snatch factor fails" },
      { x: 3, y: 1000, why: "Snatch factor fails" },
      { x: 2, y: 2000, why: "Rollback and ARD catches fails" },
    ]);
    // Worst snatch inside the window: 1.2 + 0.35 × 2 = 1.9 at 3.0 m/s with 2000 or 3000 kg, 95 % of 2.0.
    expect(r.window!.worstUtilisation).toBeCloseTo(0.95, 12);
    expect(describeRegion(r, "si")).toContain("Margin: the governing check, Snatch factor, uses at most 95 % of its limit inside the window (5 % to spare)");
  });

  it("states the window with named axes in the reader's units", () => {
    const r = studyRegion(params, cases())!;
    const si = describeRegion(r, "si");
    expect(si).toContain("entry speed 1.00 m/s to 3.00 m/s with take-up mass 1000 kg to 3000 kg");
    expect(si).toContain("2.00 m/s with 2000 kg: Rollback and ARD catches fails");
    // Source: 1 ft = 0.3048 m, 1 lb = 0.45359237 kg (exact definitions): 3 m/s = 9.84 ft/s, 3000 kg = 6614 lb.
    const us = describeRegion(r, "us");
    expect(us).toContain("entry speed 3.28 ft/s to 9.84 ft/s with take-up mass 2205 lb to 6614 lb");
    expect(us).not.toMatch(/m\/s|kg/);
    expect(axisTitle("entrySpeed", "us")).toBe("Entry speed (ft/s)");
    expect(axisTitle("takeUpMass", "si")).toBe("Take-up mass (kg)");
  });

  it("keeps apart two safe regions split by a failing band and says which one is recommended", () => {
    const cs = cases().map((c) => (c.values.entrySpeed === 2 ? { ...c, checks: c.checks.map((ch) => (ch.key === "rollback" ? { ...ch, state: "fail" } : ch)) } : c));
    const r = studyRegion(params, cs)!;
    // Left of 2.0 m/s: 6 safe cases; right of it: 4 (two fail the snatch check). The larger is recommended.
    expect(r.window!.cells).toHaveLength(6);
    expect(r.window!.xRange).toEqual([1, 1.5]);
    expect(r.detached).toBe(4);
    expect(r.window!.rectangular).toBe(true);
  });

  it("reads a minimum check (safety factor) as limit / value", () => {
    // 5 required, 8 present: 62.5 % of the way to the limit.
    expect(utilisationOf({ key: "safetyFactor", label: "", state: "pass", value: 8, limit: 5 })).toBeCloseTo(0.625, 12);
    expect(utilisationOf({ key: "snatch", label: "", state: "pass", value: 1.5, limit: 2 })).toBeCloseTo(0.75, 12);
    expect(utilisationOf({ key: "rollback", label: "", state: "pass", value: true, limit: false })).toBeNull();
  });
});

describe("contours", () => {
  it("crosses a linear field at the interpolated place", () => {
    // f = i on a 3 × 2 grid: the 1.5 level is the vertical line i = 1.5.
    const segs = contourSegments([[0, 1, 2], [0, 1, 2]], 1.5);
    expect(segs).toHaveLength(1);
    expect(segs[0].map((p) => p[0])).toEqual([1.5, 1.5]);
    expect(contourSegments([[0, null], [0, 1]], 0.5)).toEqual([]);
  });
});
