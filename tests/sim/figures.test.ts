import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { simulate } from "@/sim/simulate";
import { parseScenario } from "@/sim/schema";
import { designStatics } from "@/sim/statics";
import { G, standingTrain } from "./scenarios";

/** Load at the dog of the standing train on its incline: m·g·(sin θ + C_rr·cos θ) (no drag, no guide friction). */
function dogLoad(s: ReturnType<typeof standingTrain>): number {
  const th = (s.lift.angle! * Math.PI) / 180;
  return s.trains[0].cars * s.trains[0].carMass * G * (Math.sin(th) + s.trains[0].rollingResistance * Math.cos(th));
}

describe("figures of the steady climb under an undamped surge", () => {
  // No take-up friction, no guide friction: the train keeps surging on the chain for the whole climb.
  const s = standingTrain({ takeUp: { friction: 0 }, run: { duration: 30, segments: 60 } });
  const r = simulate(s, { frameBudget: 0, series: false });
  const F = dogLoad(s);
  const v = s.drive.speed;
  const EA = s.chain.axialStiffness;

  it("creep: the counterweight rises at F·v/(2·E·A) (negative: the drop shrinks)", () => {
    // Source: δ = F·L/(E·A) (Gere & Goodno, Mechanics of Materials) on the loaded length L = dog → top → drive,
    // which shrinks at the chain speed v as the train climbs; a 2:1 take-up moves half the chain's length
    // change (common practice, no source). So d(drop)/dt = −F·v/(2·E·A). Sign convention: takeUpCreepRate is
    // the rate of the drop (positive down), so a rising counterweight reads negative.
    const expected = -(F * v) / (2 * EA);
    expect(r.summary.surgeAmplitude!).toBeGreaterThan(0.3 * v); // the surge is there and large
    expect(Math.abs(r.summary.takeUpCreepRate! - expected) / Math.abs(expected)).toBeLessThan(0.02);
  });

  it("steady tension and snatch factor are taken at the drive", () => {
    // Definition (sim/README.md): snatch factor = peak drive tension / steady drive tension.
    expect(r.summary.snatchFactor!).toBeCloseTo(r.summary.peakDriveTension / r.summary.steadyTension!, 12);
    expect(r.summary.steadyChainSpeed!).toBeCloseTo(v, 9); // the ideal drive holds its speed
  });

  it("surge amplitude: a train picked up at rest swings ±v about chain speed", () => {
    // Source: an undamped spring–mass whose far end moves at v from force equilibrium oscillates with a
    // velocity amplitude v about v (free response to an initial relative velocity v: ẋ = v·cos ωn·t; Rao,
    // Mechanical Vibrations, §2.2). 5 %: the chain's own mass and waves.
    expect(Math.abs(r.summary.surgeAmplitude! - v) / v).toBeLessThan(0.05);
  });

  it("at a faster chain too", () => {
    const fast = standingTrain({ takeUp: { friction: 0 }, drive: { speed: 2 }, run: { duration: 20, segments: 60 } });
    const rf = simulate(fast, { frameBudget: 0, series: false });
    const expected = -(F * 2) / (2 * EA); // Source: as above, F·v/(2·E·A)
    expect(Math.abs(rf.summary.takeUpCreepRate! - expected) / Math.abs(expected)).toBeLessThan(0.02);
  });
});

describe("surge damping ratio", () => {
  it("matches ζ = c/(2√(k·m)) of the train on its loaded chain", () => {
    // The train (mass M plus a third of the loaded chain's mass) on the loaded chain, a spring k = E·A/L,
    // with the chain's Kelvin–Voigt damping D (N·s per unit strain rate) acting as a dashpot c = D/L:
    // ζ = c/(2√(k·m)) = D/(2√(E·A·L·m)) (Rao, Mechanical Vibrations, §2.6; effective spring mass m/3,
    // Rao §2.2 Rayleigh's method). Stiff, undamped contacts so only the chain damps.
    const base = standingTrain();
    const EA = base.chain.axialStiffness;
    const M = base.trains[0].cars * base.trains[0].carMass;
    const Lc = base.lift.chainTo - base.lift.chainFrom;
    const L = base.lift.chainTo - (base.trains[0].startPosition - base.trains[0].dogOffset) + Lc;
    const m = M + (base.chain.massPerLength * L) / 3;
    const zeta = 0.03;
    const D = zeta * 2 * Math.sqrt(EA * L * m);
    const s = standingTrain({ chain: { damping: D }, run: { duration: 25, segments: 30, contactDamping: 0, contactStiffness: 50 * EA } });
    const r = simulate(s, { frameBudget: 0, series: false });
    // 15 %: the loaded length shrinks along the climb, contacts and the chain's mass are lumped.
    expect(Math.abs(r.summary.surgeDampingRatio! - zeta) / zeta).toBeLessThan(0.15);
  });

  it("is null when there is no steady climb to measure it on", () => {
    const s = standingTrain({ run: { duration: 1, segments: 30 } });
    expect(simulate(s, { frameBudget: 0, series: false }).summary.surgeDampingRatio).toBeNull();
  });
});

describe("pick-up figures", () => {
  it("the worn-chain demo takes a while to come up to chain speed, as its series shows", () => {
    const file = path.join(process.cwd(), "public", "scenarios", "foxglove-worn-chain.json");
    const parsed = parseScenario(JSON.parse(readFileSync(file, "utf8")));
    if (!parsed.ok) throw new Error(parsed.issues[0].message);
    const r = simulate(parsed.scenario, { frameBudget: 0, sampleInterval: 0.01 });
    const { t, trainSpeed } = r.series;
    // Source: definition (time to chain speed: first contact → train speed within 5 % of chain speed), read
    // off the run's own series as its CSV export would give it.
    const t0 = r.summary.engagementTime!;
    const V = parsed.scenario.drive.speed;
    const i = t.findIndex((x, k) => x >= t0 && Math.abs(trainSpeed[k] - V) <= 0.05 * V);
    const fromSeries = t[i] - t0;
    expect(fromSeries).toBeGreaterThan(1);
    expect(r.summary.timeToChainSpeed!).toBeGreaterThan(0);
    expect(Math.abs(r.summary.timeToChainSpeed! - fromSeries)).toBeLessThan(0.02); // two series samples
    // The load pick-up delay (v1 definition) stays 0: the catch happens on the flat, where the load is small.
    expect(r.summary.pickupDelay).toBe(0);
    expect(r.summary.trains).toHaveLength(1);
    expect(r.summary.trains[0].timeToChainSpeed).toBe(r.summary.timeToChainSpeed);
  });
});

describe("creep on the demo lifts", () => {
  it.each(["emberline-clean-pickup", "foxglove-worn-chain"])("%s: the counterweight rises at F·v/(2·E·A)", (key) => {
    const parsed = parseScenario(JSON.parse(readFileSync(path.join(process.cwd(), "public", "scenarios", `${key}.json`), "utf8")));
    if (!parsed.ok) throw new Error(parsed.issues[0].message);
    const s = parsed.scenario;
    const r = simulate(s, { frameBudget: 0, series: false });
    // Source: δ = F·L/(E·A) (Gere & Goodno) with L shrinking at v, halved by the 2:1 take-up (common practice);
    // F is the steady load at the dog from the statics (weight component, rolling resistance, drag, guide
    // friction). 6 %: guide friction and drag vary a little along the climb.
    const F = designStatics(s).worst.dogLoad;
    const expected = -(F * s.drive.speed) / (2 * s.chain.axialStiffness);
    expect(Math.abs(r.summary.takeUpCreepRate! - expected) / Math.abs(expected)).toBeLessThan(0.06);
  });
});

describe("several trains", () => {
  it("report per-train figures; the flat keys are peaks over all trains and times of the first", () => {
    const s = JSON.parse(readFileSync(path.join(process.cwd(), "sim", "examples", "lift-hill-example-v2.json"), "utf8"));
    s.trains.push({ ...s.trains[0], startTime: 12 });
    s.run = { ...s.run, duration: 30, segments: 30 };
    const r = simulate(s, { frameBudget: 0, series: false });
    const [a, b] = r.summary.trains;
    expect(r.summary.trains).toHaveLength(2);
    // Definition (sim/README.md, Summary): flat keys describe the lift as a whole.
    expect(b.engagementTime!).toBeGreaterThan(12); // the second train appears at 12 s
    expect(r.summary.engagementTime).toBe(a.engagementTime);
    expect(r.summary.timeToChainSpeed).toBe(a.timeToChainSpeed);
    expect(r.summary.peakDogForce).toBe(Math.max(a.peakDogForce, b.peakDogForce));
    expect(r.summary.peakRiderAccel).toBe(Math.max(a.peakRiderAccel, b.peakRiderAccel));
    expect(r.summary.ardCatches).toBe(a.ardCatches + b.ardCatches);
  });
});
