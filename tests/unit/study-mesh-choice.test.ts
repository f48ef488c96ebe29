/** The study's mesh choice on synthetic figures: doubling until the check figures agree, the cap, engine failures. */
import { describe, expect, it } from "vitest";
import { chooseMesh, compareFigures, takeUpFloors, type CheckFigures } from "@/lib/studies/mesh-choice";

/**
 * Figures of a first-order method: f(N) = f∞ + C/N (Roache, Verification and Validation in Computational Science
 * and Engineering: the discretisation error of an order-1 scheme falls as 1/N). The relative change between N and
 * 2N is then (C/(2N)) / (f∞ + C/(2N)).
 */
function firstOrder(fInf: number, C: number) {
  const asked: number[] = [];
  const runAt = (n: number): CheckFigures[] => {
    asked.push(n);
    return [{ peakTension: fInf + C / n, snatchFactor: 1.5, rollbackDistance: 0, peakArdForce: 0, takeUpMaxDrop: 0.3, takeUpMaxRise: 0.02, peakDriveTension: fInf }];
  };
  return { runAt, asked };
}

describe("chooseMesh", () => {
  it("keeps the first pair when it agrees within 2 %", () => {
    // Source: Roache (above): with f∞ = 100 kN and C = 30 kN·segment, 30 → 60 segments changes the peak tension by
    // 0.5/100.5 = 0.5 %, inside the 2 % tolerance (assumption, sim/confidence.ts).
    const { runAt, asked } = firstOrder(100_000, 30_000);
    const c = chooseMesh(30, runAt);
    expect(asked).toEqual([30, 60]);
    expect(c).toMatchObject({ segments: 60, settled: true, capped: false, startSegments: 30 });
    expect(c.reason).toBe("Cases run at 60 segments: 30 and 60 agreed within 2 % on the check figures.");
  });

  it("doubles until two meshes agree", () => {
    // Source: Roache (above): with C = 300 kN·segment the change 30 → 60 is 5/105 = 4.8 %, 60 → 120 is
    // 2.5/102.5 = 2.4 %, 120 → 240 is 1.25/101.25 = 1.2 %: the first pair within 2 % is 120 and 240.
    const { runAt, asked } = firstOrder(100_000, 300_000);
    const c = chooseMesh(30, runAt);
    expect(asked).toEqual([30, 60, 120, 240]);
    expect(c).toMatchObject({ segments: 240, settled: true });
    expect(c.trials.map((t) => [t.coarse, t.fine, t.agree])).toEqual([
      [30, 60, false],
      [60, 120, false],
      [120, 240, true],
    ]);
    expect(c.trials[0].worst!.key).toBe("peakTension");
    expect(c.trials[0].worst!.relativeChange).toBeCloseTo(5 / 105, 6);
  });

  it("stops at the cap and says the mesh did not settle", () => {
    // Source: Roache (above): with C = 3000 kN·segment even 120 → 240 changes the figure by 12.5/112.5 = 11 %.
    const { runAt, asked } = firstOrder(100_000, 3_000_000);
    const c = chooseMesh(30, runAt);
    expect(asked).toEqual([30, 60, 120, 240]);
    expect(c).toMatchObject({ segments: 240, settled: false, capped: true });
    expect(c.reason).toMatch(/^Cases run at 240 segments, the cap of the mesh choice, without settling \(peak tension still changes \d+\.\d % between 120 and 240\)/);
  });

  it("goes to the cap, not past it, from a start that does not double onto it", () => {
    const { runAt, asked } = firstOrder(100_000, 3_000_000);
    chooseMesh(24, runAt);
    expect(asked).toEqual([24, 48, 96, 192, 240]);
  });

  it("keeps a start at or above the cap as it is, without probe runs", () => {
    // Plumbing: a mesh already finer than the choice would go costs no probe (each case still reports its own
    // coarse comparison).
    const { runAt, asked } = firstOrder(100_000, 30_000);
    const c = chooseMesh(300, runAt);
    expect(asked).toEqual([]);
    expect(c).toMatchObject({ segments: 300, settled: false, capped: false, error: null });
    expect(c.reason).toMatch(/^Cases run at the scenario's 300 segments, at or above the 240/);
  });

  it("keeps the last mesh that ran when the engine fails on a finer one", () => {
    const { runAt: base } = firstOrder(100_000, 300_000);
    const c = chooseMesh(30, (n) => {
      if (n > 60) throw new Error("The run used its wall-time budget");
      return base(n);
    });
    expect(c).toMatchObject({ segments: 60, settled: false, capped: false, error: "The run used its wall-time budget" });
    expect(c.reason).toContain("the engine failed on a finer mesh");
  });
});

describe("compareFigures", () => {
  it("lets a change below a figure's floor pass and counts a figure present on one mesh only", () => {
    // 1 mm of rollback against 0 is below the 2 mm floor (sim/confidence.ts): agreed.
    expect(compareFigures([{ rollbackDistance: 0 }], [{ rollbackDistance: 0.001 }]).agree).toBe(true);
    expect(compareFigures([{ snatchFactor: null }], [{ snatchFactor: 1.4 }]).agree).toBe(false);
    // The take-up's check compares its excursion with the room it has: 1 cm on a 2.5 m travel is 0.4 % of it.
    expect(compareFigures([{ takeUpMaxDrop: 0.3 }], [{ takeUpMaxDrop: 0.31 }]).agree).toBe(false);
    expect(compareFigures([{ takeUpMaxDrop: 0.3 }], [{ takeUpMaxDrop: 0.31 }], 0.02, takeUpFloors(2.5)).agree).toBe(true);
    expect(compareFigures([{ takeUpMaxDrop: 0.3 }], [{ takeUpMaxDrop: 0.36 }], 0.02, takeUpFloors(2.5)).agree).toBe(false);
    // Any probe case that disagrees decides.
    expect(compareFigures([{ peakTension: 100_000 }, { peakTension: 100_000 }], [{ peakTension: 100_500 }, { peakTension: 110_000 }]).agree).toBe(false);
  });
});
