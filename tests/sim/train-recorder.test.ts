import { describe, expect, it } from "vitest";
import { ARD_CATCH_MIN_OFF_TIME, TrainRecorder, type TrainContacts } from "@/sim/summary";

const G = 9.80665;
const context = { g: G, dogOffset: 1, dogRelease: 100, resistingLoad: () => 1 };

/** A train's contacts, scripted step by step. */
function fakeContacts(): TrainContacts {
  return { dogForce: 0, dogDeltaRate: 0, ardForce: 0, tooth: NaN, ax: 0, events: 0 };
}

describe("ARD catches and bounces", () => {
  it("count a new tooth or a landing after 0.25 s off the pawl as a catch, quicker re-touches apart", () => {
    // Definition (sim/README.md): an ARD catch is the pawl coming down on a new tooth, or on the same tooth
    // after at least 0.25 s off it; a quicker re-touch of the same tooth is a bounce. A train that starts
    // resting on the ARD has not been caught.
    const c = fakeContacts();
    const rec = new TrainRecorder(0, context);
    let t = 0;
    const step = (x: number, ard: number, tooth: number, dt = 0.01) => {
      c.ardForce = ard;
      c.tooth = tooth;
      rec.step(t, x, 0, dt, c);
      t += dt;
    };
    const liftOffAndLand = (offTime: number, tooth: number) => {
      // Pull 5 mm clear of the tooth, stay off for offTime, come back down on `tooth`.
      const n = Math.max(2, Math.round(offTime / 0.01));
      for (let i = 0; i < n; i++) step(10.005, 0, tooth);
      step(10, 5e4, tooth);
      step(10, 5e4, tooth);
    };
    step(10, 5e4, 9); // starts resting on tooth 9
    expect(rec.ardCatches).toBe(0);
    liftOffAndLand(0.1, 9);
    expect([rec.ardCatches, rec.ardBounces]).toEqual([0, 1]);
    liftOffAndLand(ARD_CATCH_MIN_OFF_TIME + 0.05, 9);
    expect([rec.ardCatches, rec.ardBounces]).toEqual([1, 1]);
    liftOffAndLand(0.05, 9.15); // a new tooth, however quickly
    expect([rec.ardCatches, rec.ardBounces]).toEqual([2, 1]);
    expect(rec.lastArdCatchTime).not.toBeNull();
  });
});

describe("rider-acceleration exposure", () => {
  it("times the filtered acceleration above each level from the first-order step response", () => {
    // Source: a first-order low-pass with time constant τ answers a step A with A·(1 − e^(−t/τ)) and its end
    // with A·e^(−t/τ) (Ogata, Modern Control Engineering, first-order systems). A 1 s pulse of 0.3 g is above
    // 0.25 g from τ·ln(0.3/0.05) after its start until τ·ln(0.3/0.25) after its end.
    const c = fakeContacts();
    const rec = new TrainRecorder(0, context);
    const dt = 0.0005;
    const tau = 0.05;
    for (let i = 0; i * dt <= 3; i++) {
      const t = i * dt;
      c.ax = t >= 0.5 && t < 1.5 ? -0.3 * G : 0; // slowing: the backward direction
      rec.step(t, 10, 0, i === 0 ? 0 : dt, c);
    }
    const e = rec.exposure(3);
    const expected = 1 - tau * Math.log(0.3 / 0.05) + tau * Math.log(0.3 / 0.25);
    expect(Math.abs(e.backward[4] - expected)).toBeLessThan(0.005); // level 5 × 0.05 = 0.25 g; 0.5 % of τ per step
    expect(e.forward[4]).toBe(0);
    expect(e.backwardPeak).toBeCloseTo(0.3, 3);
  });
});
