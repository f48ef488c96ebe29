import { describe, expect, it } from "vitest";
import { simulate } from "@/sim/simulate";
import { scenario, standingTrain } from "./scenarios";

describe("anti-rollback", () => {
  it("no rollback when the chain is very stiff and the train is engaged gently", () => {
    // Source: with a rigid chain and a slow ramp the dog takes the load before the pawl lifts off
    // (statics; common practice, no source). Tolerance: 1 mm of backward travel, no ARD catch.
    const r = simulate(
      standingTrain({ chain: { axialStiffness: 1e9 }, drive: { rampTime: 4 }, run: { duration: 6, segments: 30 } }),
      { frameBudget: 0, series: false },
    );
    expect(r.summary.engagementTime).not.toBeNull();
    expect(r.summary.rollbackDistance).toBeLessThan(0.001);
    expect(r.summary.ardCatches).toBe(0);
  });

  it("holds a train that loses the chain on the lift within one tooth spacing", () => {
    // The dog releases half-way up the incline: the train stops and rolls back onto the last tooth passed.
    const s = standingTrain({ run: { duration: 12, segments: 30 } });
    const r2 = simulate({ ...s, lift: { ...s.lift, dogRelease: s.trains[0].startPosition - s.trains[0].dogOffset + 2 } }, { frameBudget: 0, series: false });
    expect(r2.summary.ardCatches).toBeGreaterThanOrEqual(1);
    // Source: the pawl falls on the last tooth it passed, so the rollback is at most one tooth spacing
    // plus the compression of the pawl contact (the model's definition, issue 3).
    const k = r2.diagnostics.contactStiffness as number; // default: E·A / max(1 m, strand segment / 4)
    expect(k).toBeCloseTo(s.chain.axialStiffness / Math.max(1, r2.layout.strandLength / ((r2.layout.stations.length - 1) / 2) / 4), -3);
    expect(r2.summary.peakArdCompression).toBeCloseTo(r2.summary.peakArdForce / k, 9);
    expect(r2.summary.rollbackDistance - r2.summary.peakArdCompression).toBeLessThanOrEqual(s.antiRollback.toothSpacing + 1e-6);
    expect(r2.notes.join(" ")).not.toMatch(/rolled back/);
    expect(r2.summary.peakArdForce).toBeGreaterThan(0);
  });

  it("reports a rollback failure when the ARD is switched off", () => {
    const s = standingTrain({ antiRollback: { enabled: false }, run: { duration: 6, segments: 30 } });
    const r = simulate({ ...s, lift: { ...s.lift, dogRelease: s.trains[0].startPosition - s.trains[0].dogOffset + 1 } }, { frameBudget: 0, series: false });
    expect(r.summary.rollbackDistance).toBeGreaterThan(s.antiRollback.toothSpacing);
    expect(r.notes.join(" ")).toMatch(/rolled back/);
    void scenario;
  });
});
