import { describe, expect, it } from "vitest";
import { driveDampingAccount, type DriveDampingInput } from "@/components/run/driveDamping";

// The run view's "drive model and damping" account: it quotes the run's inputs and figures in words.
const base: DriveDampingInput = {
  drive: { speed: 2.5, efficiency: 0.9, location: "bottom", motor: { kind: "induction", ratedPower: 200_000, ratedSlip: 0.015, breakdownRatio: 2.3, reflectedMass: 12_400 } },
  chain: { damping: 2000, lossFactor: 0.02, guideFriction: 0.12 },
  takeUp: { mass: 5000, friction: 1000, damping: 0 },
  contacts: { dogStiffness: 5e7, ardStiffness: 5e7, dampingRatio: 0.1 },
  gravity: 9.80665,
  summary: { steadyChainSpeed: 2.465, surgeAmplitude: 0.05, surgeDampingRatio: 0.031 },
};

const text = (x: DriveDampingInput, units: "si" | "us" = "si") => Object.fromEntries(driveDampingAccount(x, units).map((l) => [l.key, l.text]));

describe("drive and damping account", () => {
  it("an induction drive: its data, and the slip of the run from the steady chain speed", () => {
    const t = text(base);
    expect(t.drive).toContain("200.0 kW");
    expect(t.drive).toContain("rated slip 1.5 %");
    expect(t.drive).toContain("2.30 × rated");
    // Source: slip s = (n_s − n)/n_s (definition of slip, e.g. Chapman, Electric Machinery Fundamentals; from memory):
    // (2.5 − 2.465)/2.5 = 1.40 %.
    expect(t.drive).toContain("a slip of 1.40 %");
  });

  it("the chain's loss factor in words: 2π·η of the strain energy per cycle, ζ ≈ η/2", () => {
    const t = text(base);
    // Source: hysteretic damping, energy lost per cycle ΔW = 2π·η·W and ζ_eq = η/2 at resonance (Rao, Mechanical Vibrations; from memory).
    // 2π × 0.02 = 12.6 %; 0.02 / 2 = 1.0 %.
    expect(t.chain).toContain("12.6 %");
    expect(t.chain).toContain("damping ratio of 1.0 %");
  });

  it("the take-up's friction as a share of the counterweight's weight", () => {
    // 1000 N / (5000 kg × 9.80665 m/s²) = 2.04 % (arithmetic).
    expect(text(base).takeUp).toContain("(2.0 % of its weight)");
    expect(text({ ...base, takeUp: { mass: 5000, friction: 0, damping: 0 } }).takeUp).toContain("takes no energy out of the surge");
  });

  it("an ideal drive says it absorbs nothing; a stop and an unmeasured surge are said plainly", () => {
    const t = text({ ...base, drive: { speed: 2.5, efficiency: 0.9, motor: { kind: "ideal" }, stop: { time: 30, kind: "brake", duration: 0.5 } }, summary: { surgeDampingRatio: null } });
    expect(t.drive).toContain("takes no energy out of the surge");
    expect(t.stop).toContain("brings the chain to rest over 0.50 s");
    expect(t.surge).toContain("could not be measured");
    expect(text({ ...base, summary: {} }).surge).toContain("do not include the surge's damping ratio");
  });

  it("US customary units on screen", () => {
    // 200 kW / 745.7 W/hp = 268.2 hp (NIST SP 811 conversion factors).
    expect(text(base, "us").drive).toContain("268.2 hp");
  });
});
