import { describe, expect, it } from "vitest";
import { stopAccount } from "@/lib/runs/stop-account";
import type { StopFigures } from "@/sim/stop";

// The account of a stop on the lift states the settle-back inequality with the run's numbers, in the
// reader's units. The figures here are a worked example, not taken from the code under test.
const base: StopFigures = {
  time: 15,
  kind: "brake",
  trainSpeed: 2,
  chainStiffness: 1e5,
  trainMass: 4000,
  load: 30_000,
  // Source: Rao, Mechanical Vibrations (free response of a spring–mass to an initial velocity): the force
  // amplitude is v·√(k·m) = 2 m/s × √(1e5 N/m × 4000 kg) = 2 × 20 000 = 40 000 N.
  swingForce: 40_000,
  // Source: Rao — period 2π·√(m/k) = 2π × √(0.04 s²) = 1.2566 s.
  swingPeriod: 2 * Math.PI * 0.2,
  predictsRollback: true,
  dogUnloaded: true,
  ardCatches: 1,
  peakArdForce: 250_000,
  rollback: 0.05,
  restartTime: 22,
  restartToPickup: 1.5,
};
const series = { t: [0, 14, 15.2, 15.4, 16], ardForce: [0, 0, 0, 1000, 2000] };

describe("the stop's settle-back account", () => {
  it("says which inequality decided it, with the numbers, when the train rolls back", () => {
    const a = stopAccount({ stop: base, duration: 0.3, series });
    const text = a.sentences.join(" ");
    expect(text).toContain("At 15.00 s the drive braked the chain to rest in 0.30 s");
    expect(text).toContain("v·√(k·m) = 2.00 m/s × √(100 kN/m × 4,000 kg) = 40.0 kN about the load the dog carries, F = 30.0 kN: 40.0 kN > 30.0 kN, so the dog unloaded and the train rolled back 50 mm onto the ARD");
    expect(text).toContain("2π·√(m/k) = 1.26 s");
    expect(a.catchTime).toBe(15.4);
    expect(a.pickupTime).toBe(23.5);
    expect(text).toContain("The drive restarted at 22.00 s; the dog carried the train again 1.50 s later, at 23.50 s.");
  });

  it("says the chain held the train when v·√(k·m) ≤ F", () => {
    const held = { ...base, load: 45_000, predictsRollback: false, dogUnloaded: false, ardCatches: 0, rollback: 0, peakArdForce: 0, restartTime: null, restartToPickup: null };
    const a = stopAccount({ stop: held, duration: null, series: { t: series.t, ardForce: [0, 0, 0, 0, 0] } });
    const text = a.sentences.join(" ");
    expect(a.inequality).toBe("40.0 kN ≤ 45.0 kN");
    expect(text).toContain("so the dog stayed loaded and the chain held the train.");
    expect(text).toContain("The drive did not restart during the run.");
    expect(a.catchTime).toBeNull();
  });

  it("writes US customary units for a US reader", () => {
    const text = stopAccount({ stop: base, duration: 0.3, series }, "us").sentences.join(" ");
    // Source: 1 kip = 4448.22 N (NIST SP 811): 40 000 N = 8.99 kip, 30 000 N = 6.74 kip; 2 m/s = 6.56 ft/s.
    expect(text).toContain("8.99 kip > 6.74 kip");
    expect(text).toContain("6.56 ft/s");
  });
});
