import { describe, expect, it } from "vitest";
import { evaluateChecks, reasonText, type Check } from "@/sim/checks";
import type { DesignStatics } from "@/sim/statics";
import type { Summary } from "@/sim/summary";
import { formatReason } from "@/lib/client/units";
import { reasonIn } from "@/lib/reports/format";

// Source: NIST SP 811 (2008), Appendix B.8/B.9: 1 lbf = 4.448 222 N (so 1 kip = 4448.222 N),
// 1 in = 0.0254 m (exact), 1 ft = 0.3048 m (exact), 1 hp (550 ft·lbf/s) = 745.6999 W.
const KIP = 4448.222;
const INCH = 0.0254;
const FOOT = 0.3048;
const HP = 745.6999;

// A run summary and statics with round figures (only the fields the checks read).
const summary = {
  snatchFactor: 1.85,
  peakTension: 161_300,
  peakDriveTension: 161_320,
  steadyTension: 87_200,
  minSafetyFactor: 3.1,
  rollbackDistance: 0.0123,
  peakArdCompression: 0.002,
  ardCatches: 2,
  ardBounces: 1,
  peakArdForce: 52_000,
  pickupDelay: 0.4,
  timeToChainSpeed: 1.2,
  engagementTime: 1.2,
  takeUpMaxDrop: 0.627,
  takeUpMaxRise: 0.088,
  takeUpEndStop: false,
  takeUpCreepRate: -0.00562,
  steadyClimbDuration: 3,
  peakDrivePower: 422_300,
  peakRiderAccel: 0.3,
  simulatedTime: 30,
  riderAccelExposure: { forward: [0.9, 0.4, 0.2, 0.1, 0.05, 0], backward: [0.5, 0.2, 0, 0, 0, 0], forwardPeak: 0.3, backwardPeak: 0.12 },
} as unknown as Summary;
const statics = {
  safetyFactor: 6,
  ardToothSpacing: 0.15,
  motorPower: 150_400,
  takeUp: { roomBelow: 1.3, roomAbove: 1.2, required: 3.73, travel: 2.5, elasticExcursion: 0.7, thermal: 0.05, runningRequired: 0.75, wearAllowance: 2.98, wearCapacity: 1.76 },
  worst: { maxTension: 92_000 },
  breakingStrength: 500_000,
  pitch: 0.1016,
} as unknown as DesignStatics;
const checks = evaluateChecks(summary, statics, { allowRollback: true, motorRating: 200_000 });
const byKey = (k: string) => checks.find((c) => c.key === k)!;

/** x in a unit, to the given decimals, as the screen groups it (en-GB). */
const num = (x: number, d: number) => x.toLocaleString("en-GB", { minimumFractionDigits: d, maximumFractionDigits: d });

describe("check reasons in the reader's units", () => {
  it("keep the SI line, and its parts read the same in SI", () => {
    for (const c of checks) {
      expect(reasonText(c.parts)).toBe(c.reason);
      expect(formatReason(c, "si")).toBe(c.reason);
      expect(reasonIn(c, "si")).toBe(c.reason);
    }
    expect(byKey("snatch").reason).toBe("Peak drive tension 161.3 kN is 1.85× the steady 87.2 kN (limit 2.00×); peak anywhere 161.3 kN.");
  });

  it("show kip, in, ft and hp in US customary on the screen, and no SI unit", () => {
    const snatch = formatReason(byKey("snatch"), "us");
    expect(snatch).toBe(`Peak drive tension ${num(161_320 / KIP, 2)} kip is 1.85× the steady ${num(87_200 / KIP, 2)} kip (limit 2.00×); peak anywhere ${num(161_300 / KIP, 2)} kip.`);
    expect(snatch).toContain("36.26 kip");
    const rollback = formatReason(byKey("rollback"), "us");
    expect(rollback).toContain(`peak ${num(52_000 / KIP, 2)} kip, ${num(0.0123 / INCH, 2)} in back`);
    const power = formatReason(byKey("drivePower"), "us");
    expect(power).toBe(`Steady ${num(150_400 / HP, 1)} hp and peak ${num(422_300 / HP, 1)} hp against a ${num(200_000 / HP, 1)} hp motor.`);
    const travel = formatReason(byKey("takeUpTravel"), "us");
    expect(travel).toContain(`Run excursion ${num(0.627 / INCH, 2)} in down / ${num(0.088 / INCH, 2)} in up`);
    // The wear allowance is reported apart from the elastic travel budget (its own check).
    expect(formatReason(byKey("takeUpWear"), "us")).toContain(`needs ${num(2.98 / FOOT, 2)} ft of travel`);
    expect(formatReason(byKey("workingLoad"), "us")).toContain(`Steady ${num(92_000 / KIP, 2)} kip and peak ${num(161_300 / KIP, 2)} kip`);
    const creep = formatReason(byKey("takeUpCreep"), "us");
    expect(creep).toContain(`rises ${num(0.00562 / INCH, 3)} in/s`);
    for (const c of checks) {
      const us = formatReason(c, "us");
      expect(us).not.toMatch(/\b(kN|mm|kW|m)\b|mm\/s/);
    }
  });

  it("show the same US units in a report", () => {
    expect(reasonIn(byKey("snatch"), "us")).toBe(`Peak drive tension ${(161_320 / KIP).toFixed(2)} kip is 1.85× the steady ${(87_200 / KIP).toFixed(2)} kip (limit 2.00×); peak anywhere ${(161_300 / KIP).toFixed(2)} kip.`);
    expect(reasonIn(byKey("takeUpCreep"), "us")).toContain(`rises ${(0.00562 / INCH).toFixed(3)} in/s`);
    expect(reasonIn(byKey("drivePower"), "us")).toContain(`${(422_300 / HP).toFixed(1)} hp`);
    for (const c of checks) expect(reasonIn(c, "us")).not.toMatch(/\b(kN|mm|kW|m)\b/);
  });

  it("write the release check's speed and energies in ft/s and ft·lbf for a US reader, with no SI unit left", () => {
    // Source: NIST SP 811 (2008), Appendix B.8/B.9: 1 m/s = 3.280 840 ft/s, 1 kJ = 737.5621 ft·lbf
    // (1 ft·lbf = 1.355 818 J).
    const FT_PER_S = 3.28084;
    const FT_LBF_PER_KJ = 737.562;
    const released = {
      ...summary,
      release: { time: 41.25, position: 96.4, speed: 1.82, kineticEnergy: 9_936, rise: 0.74, energyNeeded: 7_880, margin: 1.26, reengagedAt: null },
    } as unknown as Summary;
    const release = evaluateChecks(released, statics, { allowRollback: true, motorRating: 200_000 }).find((c) => c.key === "release")!;
    expect(release.reason).toContain("moves at 1.82 m/s");
    expect(release.reason).toContain("kinetic energy 9.9 kJ against 7.9 kJ");
    const us = formatReason(release, "us");
    expect(us).not.toMatch(/m\/s|kJ|\bm\b/);
    // 1.82 m/s = 5.97 ft/s; 9.936 kJ = 7328 ft·lbf; 7.880 kJ = 5812 ft·lbf (hand conversion).
    expect(us).toContain(`moves at ${num(1.82 * FT_PER_S, 2)} ft/s`);
    expect(us).toContain("moves at 5.97 ft/s");
    expect(us).toContain(`kinetic energy ${num(9.936 * FT_LBF_PER_KJ, 0)} ft·lbf against ${num(7.88 * FT_LBF_PER_KJ, 0)} ft·lbf`);
    expect(us).toContain("kinetic energy 7,328 ft·lbf against 5,812 ft·lbf");
    expect(us).toContain(`rise ${num(0.74 / FOOT, 2)} ft to the crest`);
    const report = reasonIn(release, "us");
    expect(report).not.toMatch(/m\/s|kJ|\bm\b/);
    expect(report).toContain(`moves at ${(1.82 * FT_PER_S).toFixed(2)} ft/s`);
    expect(report).toContain(`kinetic energy ${(9.936 * FT_LBF_PER_KJ).toFixed(0)} ft·lbf against ${(7.88 * FT_LBF_PER_KJ).toFixed(0)} ft·lbf`);
  });

  it("fall back to the SI line for a check without parts (stored by an older version)", () => {
    const old = { ...byKey("snatch"), parts: undefined } as unknown as Check;
    expect(formatReason(old, "us")).toBe(old.reason);
    expect(reasonIn(old, "us")).toBe(old.reason);
  });
});
