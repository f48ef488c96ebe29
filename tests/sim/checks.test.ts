import { describe, expect, it } from "vitest";
import { b29MinimumStrength, evaluateChecks, timeAbove, type Check } from "@/sim/checks";
import { LIMIT_SOURCES, limitsSchema } from "@/sim/schema";
import type { DesignStatics } from "@/sim/statics";
import { RIDER_ACCEL_LEVEL_STEP, type Summary } from "@/sim/summary";

// Source: NIST SP 811 (2008), Appendix B.8/B.9: 1 lbf = 4.448 222 N, 1 in = 0.0254 m (exact).
const LBF = 4.448222;

/** A summary and statics with round figures (only the fields the checks read). */
function inputs(over: { summary?: Record<string, unknown>; statics?: Record<string, unknown>; takeUp?: Record<string, unknown> } = {}) {
  const summary = {
    snatchFactor: 1.3,
    peakTension: 90_000,
    peakDriveTension: 88_000,
    steadyTension: 68_000,
    minSafetyFactor: 7.7,
    rollbackDistance: 0,
    peakArdCompression: 0,
    ardCatches: 0,
    ardBounces: 0,
    peakArdForce: 0,
    pickupDelay: 0,
    timeToChainSpeed: 1.2,
    engagementTime: 2.4,
    takeUpMaxDrop: 0.4,
    takeUpMaxRise: 0.05,
    takeUpEndStop: false,
    takeUpCreepRate: -0.004,
    steadyClimbDuration: 12,
    peakDrivePower: 200_000,
    peakRiderAccel: 0.2,
    simulatedTime: 40,
    riderAccelExposure: { forward: [3, 1, 0.3, 0, 0], backward: [2, 0.5, 0, 0, 0], forwardPeak: 0.2, backwardPeak: 0.12 },
    ...over.summary,
  } as unknown as Summary;
  const statics = {
    safetyFactor: 8,
    ardToothSpacing: 0.15,
    motorPower: 150_000,
    worst: { maxTension: 80_000 },
    breakingStrength: 700_000,
    pitch: 0.1016,
    takeUp: { roomBelow: 1.3, roomAbove: 1.2, travel: 2.5, elasticExcursion: 0.31, thermal: 0.05, runningRequired: 0.36, wearAllowance: 3.4, wearCapacity: 1.9, ...over.takeUp },
    ...over.statics,
  } as unknown as DesignStatics;
  return { summary, statics };
}

const check = (checks: Check[], key: string) => checks.find((c) => c.key === key)!;

describe("breaking strength against the pitch", () => {
  it("uses ASME B29.1's 12,500·P² lbf (P in inches)", () => {
    // Source: ASME B29.1 minimum ultimate tensile strength of standard roller chain = 12,500·P² lbf per strand
    // (from memory; e.g. No. 80, P = 1 in: 12,500 lbf). A 4 in pitch: 200,000 lbf.
    expect(b29MinimumStrength(0.0254) / LBF).toBeCloseTo(12_500, 0);
    expect(b29MinimumStrength(4 * 0.0254) / LBF).toBeCloseTo(200_000, 0);
  });

  it("is a caution, never a fail, outside the band", () => {
    const { summary, statics } = inputs();
    const weak = check(evaluateChecks(summary, statics), "breakingStrength"); // 700 kN vs 889.6 kN
    expect(weak.state).toBe("caution");
    expect(weak.value as number).toBeCloseTo(700_000 / (200_000 * LBF), 4);
    const strong = inputs({ statics: { breakingStrength: 1_000_000 } });
    expect(check(evaluateChecks(strong.summary, strong.statics), "breakingStrength").state).toBe("pass");
    const huge = inputs({ statics: { breakingStrength: 9e6 } });
    expect(check(evaluateChecks(huge.summary, huge.statics), "breakingStrength").state).toBe("caution");
  });
});

describe("chain working load (fatigue)", () => {
  it("defaults to 1/7 of breaking strength and names it an assumption", () => {
    // Source: chain makers limit working load to roughly 1/6–1/9 of ultimate strength (common practice, no
    // source); 1/7 is our assumption. 700 kN / 7 = 100 kN: steady 85 kN and peak 90 kN are below it.
    const { summary, statics } = inputs({ statics: { worst: { maxTension: 85_000 } } });
    const c = check(evaluateChecks(summary, statics), "workingLoad");
    expect(c.state).toBe("caution"); // steady 85 kN is above 0.8 × 100 kN
    expect(c.reason).toContain("100.0 kN");
    expect(c.reason).toContain("1/7");
    expect(LIMIT_SOURCES.workingLoadFraction).toMatch(/assumption/);
  });

  it("fails a steady tension above the maker's allowable working load, cautions a peak above it", () => {
    const { summary, statics } = inputs();
    expect(check(evaluateChecks(summary, statics, { allowableWorkingLoad: 75_000 }), "workingLoad").state).toBe("fail");
    expect(check(evaluateChecks(summary, statics, { allowableWorkingLoad: 85_000 }), "workingLoad").state).toBe("caution");
    expect(check(evaluateChecks(summary, statics, { allowableWorkingLoad: 120_000 }), "workingLoad").state).toBe("pass");
  });
});

describe("rider acceleration envelope", () => {
  it("reads the time above a level conservatively from the exposure grid", () => {
    // Definition: entry k is the longest time above (k + 1)·step g; a level between grid points uses the one below.
    const e = [3, 1, 0.3, 0];
    expect(timeAbove(e, 2 * RIDER_ACCEL_LEVEL_STEP, 40)).toBe(1);
    expect(timeAbove(e, 2.5 * RIDER_ACCEL_LEVEL_STEP, 40)).toBe(1);
    expect(timeAbove(e, 0.5 * RIDER_ACCEL_LEVEL_STEP, 40)).toBe(40);
  });

  it("fails a level held longer than allowed, by direction, and a peak above the ceiling", () => {
    // Forward 1 s above 0.10 g: allowed 2 s at 0.10 g passes, 0.8 s fails.
    const { summary, statics } = inputs();
    const lim = { riderAccelSustained: 0.1, riderAccelSustainedDuration: 2 };
    expect(check(evaluateChecks(summary, statics, lim), "riderAccel").state).toBe("pass");
    const tight = check(evaluateChecks(summary, statics, { ...lim, riderAccelSustainedDuration: 0.8 }), "riderAccel");
    expect(tight.state).toBe("fail");
    expect(tight.reason).toContain("forward 1.00 s above 0.10 g");
    // Backward levels are scaled: at half the forward levels, 0.5 s above 0.05 g backward against 0.4 s allowed.
    const back = check(evaluateChecks(summary, statics, { riderAccelSustained: 0.1, riderAccelSustainedDuration: 0.4, riderAccelBackwardScale: 0.5 }), "riderAccel");
    expect(back.state).toBe("fail");
    // Ceiling: peak 0.2 g forward against 0.15 g.
    expect(check(evaluateChecks(summary, statics, { riderAccelCeiling: 0.15 }), "riderAccel").state).toBe("fail");
  });

  it("ships its defaults as assumptions, naming the standard without its numbers", () => {
    for (const k of ["maxRiderAccel", "riderAccelBriefDuration", "riderAccelSustained", "riderAccelSustainedDuration", "riderAccelCeiling", "riderAccelBackwardScale"] as const) {
      expect(LIMIT_SOURCES[k]).toMatch(/assumption/);
    }
    expect(LIMIT_SOURCES.maxRiderAccel).toContain("ASTM F2291");
  });
});

describe("take-up travel and wear, reported apart", () => {
  it("passes the running budget while the wear allowance that does not fit is its own caution", () => {
    const { summary, statics } = inputs();
    const checks = evaluateChecks(summary, statics);
    expect(check(checks, "takeUpTravel").state).toBe("pass");
    const wear = check(checks, "takeUpWear");
    expect(wear.state).toBe("caution");
    expect(wear.value).toBeCloseTo(1.9, 9);
  });

  it("fails the travel when the elastic drop and heat alone exceed it", () => {
    const { summary, statics } = inputs({ takeUp: { runningRequired: 2.6, elasticExcursion: 2.55 } });
    expect(check(evaluateChecks(summary, statics), "takeUpTravel").state).toBe("fail");
  });
});

describe("pick-up", () => {
  it("judges the load delay and the time to chain speed, each against its own limit", () => {
    const { summary, statics } = inputs();
    expect(check(evaluateChecks(summary, statics), "pickup").state).toBe("pass");
    expect(check(evaluateChecks(summary, statics, { maxTimeToChainSpeed: 1 }), "pickup").state).toBe("fail");
    expect(check(evaluateChecks(summary, statics), "pickup").reason).toContain("1.20 s");
  });
});

describe("every limit", () => {
  it("names its source or says assumption", () => {
    for (const k of Object.keys(limitsSchema.shape)) expect(LIMIT_SOURCES[k as keyof typeof LIMIT_SOURCES]).toBeTruthy();
  });
});
