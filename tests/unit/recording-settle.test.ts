import { describe, expect, it } from "vitest";
import { recordedSettleBack } from "@/lib/recordings/settle";

// A recorded dispatch: the train arrives at 3.0 m/s against a 2.5 m/s chain, slows to a stop, rolls back at
// 0.1 m/s for 0.5 s (5 cm), stands on the ARD for 1 s, then the dog takes it up to chain speed.
function dispatch() {
  const t: number[] = [];
  const v: number[] = [];
  for (let k = 0; k <= 600; k++) {
    const s = k * 0.01;
    t.push(s);
    v.push(s < 2 ? 3 - 1.5 * s : s < 2.5 ? -0.1 : s < 3.5 ? 0 : Math.min(2.5, (s - 3.5) * 2));
  }
  return { t, trainSpeed: v, trainPosition: v.map(() => null), engagementTime: 1.0 };
}

const design = {
  lift: { angle: 40, chainFrom: 10, chainTo: 122 },
  chain: { axialStiffness: 1.5e7 },
  drive: { speed: 2.5 },
  train: { cars: 6, carMass: 1300, dogOffset: 1.3, rollingResistance: 0.015, entrySpeed: 0 },
  gravity: 9.80665,
};

describe("settle-back account of a recorded dispatch", () => {
  it("finds the rest on the ARD from the recorded speed and explains it", () => {
    const a = recordedSettleBack(dispatch(), design)!;
    expect(a).not.toBeNull();
    expect(a.arrivalSpeed).toBe(3);
    // The catch is where the train stands still after rolling back (2.5 s), the pick-up where it reaches 95 % of chain speed.
    expect(a.catchTime).toBeCloseTo(2.5, 2);
    // Speed rises at 2 m/s² from 3.5 s, so 95 % of 2.5 m/s is reached at 3.5 + 2.375 / 2 s.
    expect(a.pickupTime).toBeCloseTo(3.5 + (0.95 * 2.5) / 2, 1);
    // Rollback: 0.1 m/s for 0.5 s = 50 mm (trapezoid edges give ±1 mm).
    expect(a.rollback).toBeGreaterThan(0.048);
    expect(a.rollback).toBeLessThan(0.052);
    expect(a.sentences.join(" ")).toContain("the logger does not record the ARD force");
    expect(a.sentences[0]).toContain("faster than the chain");
  });

  it("says nothing when the train never rolled back or no speed was recorded", () => {
    const d = dispatch();
    expect(recordedSettleBack({ ...d, trainSpeed: d.trainSpeed.map((x) => Math.max(0.5, x)) }, design)).toBeNull();
    expect(recordedSettleBack({ ...d, trainSpeed: d.trainSpeed.map(() => null) }, design)).toBeNull();
  });
});
