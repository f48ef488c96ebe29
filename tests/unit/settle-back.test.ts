import { describe, expect, it } from "vitest";
import { settleBackAccount, type SettleBackInput } from "@/lib/runs/settle-back";

// A hand-made run: a 6-car, 7 800 kg train on a 40° incline, caught by the ARD at t = 5.0 s.
function input(over: Partial<SettleBackInput["summary"]> = {}): SettleBackInput {
  const t = [4.8, 4.9, 5.0, 5.1, 5.2];
  return {
    lift: { angle: 40, chainFrom: 10, chainTo: 122 },
    chain: { axialStiffness: 1.5e7 },
    drive: { speed: 2.5 },
    train: { cars: 6, carMass: 1300, dogOffset: 1.3, rollingResistance: 0.015, entrySpeed: 4.5 },
    gravity: 9.80665,
    summary: { ardCatches: 1, rollbackDistance: 0.125, engagementTime: 5.4, pickupDelay: 0, peakArdForce: 60_000, ...over },
    series: { t, ardForce: [0, 0, 1200, 800, 0], trainPosition: [28.3, 28.2, 28.14, 28.15, 28.2], trainSpeed: [0.2, -0.3, -0.5, 0.4, 0.6] },
  };
}

describe("settleBackAccount", () => {
  it("returns nothing for a run without an ARD catch", () => {
    expect(settleBackAccount(input({ ardCatches: 0 }))).toBeNull();
  });

  it("computes the stretch, its pay-out time and the rest on the ARD from the numbers", () => {
    const a = settleBackAccount(input())!;
    // Source: statics of a train on an incline, common practice, no source: pull = m·g·(sin θ + C_rr·cos θ).
    const th = (40 * Math.PI) / 180;
    const pull = 7800 * 9.80665 * (Math.sin(th) + 0.015 * Math.cos(th));
    expect(a.pull).toBeCloseTo(pull, 6);
    expect(a.pull / 1000).toBeCloseTo(50.06, 1);
    // Loaded length: dog at 28.14 − 1.3 = 26.84 m, up to the top idler at 122 m (95.16 m), then the
    // return strand of 112 m down to the drive: 207.16 m.
    expect(a.loadedLength).toBeCloseTo(207.16, 6);
    // Hooke's law for the chain (strain = T / E·A): stretch = pull × length / E·A ≈ 0.691 m.
    expect(a.stretch).toBeCloseTo((pull * 207.16) / 1.5e7, 9);
    expect(a.stretch * 1000).toBeCloseTo(691.4, 0);
    // Paid out at chain speed: T = stretch / V ≈ 0.277 s.
    expect(a.stretchTime).toBeCloseTo(a.stretch / 2.5, 9);
    expect(a.catchTime).toBe(5.0);
    expect(a.restTime).toBeCloseTo(0.4, 9);
    expect(a.sentences).toHaveLength(4);
    expect(a.sentences[0]).toContain("4.50 m/s");
    expect(a.sentences[2]).toContain("691 mm over its 207.2 m of loaded length");
    expect(a.sentences[3]).toContain("rested on the ARD for 0.40 s");
    expect(a.sentences[3]).toContain("rolling back 125 mm");
  });

  it("writes the account in US customary with no SI unit left", () => {
    const a = settleBackAccount(input(), "us")!;
    const text = a.sentences.join(" ");
    // Source: NIST SP 811 appendix B (1 ft = 0.3048 m, 1 in = 25.4 mm, 1 kip = 4448.2216 N):
    // 4.5 m/s = 14.76 ft/s; 691.2 mm = 27.21 in; 207.16 m = 679.66 ft; 50.05 kN = 11.25 kip.
    expect(a.sentences[0]).toContain("14.76 ft/s");
    expect(a.sentences[2]).toContain("27.21 in over its 679.66 ft of loaded length");
    expect(a.sentences[2]).toContain("11.25 kip pull");
    expect(text).not.toMatch(/\d (m|mm|kN|MN|m\/s|kg)\b/);
  });

  it("says so when the dog never picks the train up", () => {
    const a = settleBackAccount(input({ engagementTime: null, pickupDelay: null }))!;
    expect(a.restTime).toBeNull();
    expect(a.sentences[3]).toContain("until the end of the run");
  });
});
