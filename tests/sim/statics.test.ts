import { describe, expect, it } from "vitest";
import { chordalRadiusVariation, chordalSpeedVariation, designStatics } from "@/sim/statics";
import { simulate } from "@/sim/simulate";
import { buildTrack } from "@/sim/track";
import { G, scenario } from "./scenarios";

describe("sprocket chordal action", () => {
  it("matches the tabulated 1 − cos(180°/N)", () => {
    // Source: Juvinall & Marshek; values [derived] in docs/references.md. Tolerance: their rounding (0.0005 %).
    const table: [number, number][] = [[9, 6.031], [10, 4.894], [12, 3.407], [16, 1.921], [20, 1.231], [24, 0.856], [30, 0.548]];
    for (const [z, pct] of table) expect(Math.abs(chordalRadiusVariation(z) * 100 - pct)).toBeLessThan(0.0006);
  });

  it("uses Δv/v = (π/N)[1/sin(180°/N) − 1/tan(180°/N)] and D = p/sin(180°/N)", () => {
    // Source: Juvinall & Marshek, Fundamentals of Machine Component Design (chordal speed variation).
    const N = 11;
    const a = Math.PI / N;
    expect(chordalSpeedVariation(N)).toBeCloseTo((Math.PI / N) * (1 / Math.sin(a) - 1 / Math.tan(a)), 14);
    const d = designStatics(scenario());
    expect(d.pitchDiameter).toBeCloseTo(0.1016 / Math.sin(a), 12);
    expect(d.chordalRadiusVariation).toBeCloseTo(1 - Math.cos(a), 14);
  });
});

describe("design statics", () => {
  // Chain only on a straight incline, no friction: every steady tension has a closed form.
  const angle = 35;
  const th = (angle * Math.PI) / 180;
  const lift = { approachLength: 10, sagRadius: 20, angle, inclineLength: 100, crestRadius: 20, exitLength: 20, bottomRun: 4 };
  const tr = buildTrack({ ...lift, chainFrom: 0, chainTo: 0, dogRelease: 0 });
  const from = tr.inclineStart;
  const to = tr.crestStart;
  const s = scenario({
    lift: { ...lift, chainFrom: from, chainTo: to, dogRelease: to - 1 },
    chain: { guideFriction: 0, catchOffset: from },
    train: { startPosition: from + 20, dragArea: 0 },
    antiRollback: { from: from + 1, to: to - 1 },
  });
  const d = designStatics(s, { positions: 41 });
  const mu = s.chain.massPerLength;
  const EA = s.chain.axialStiffness;
  const M = s.trains[0].cars * s.trains[0].carMass;
  const T0 = (s.takeUp.mass * G) / 2;

  it("carries half the counterweight in each take-up leg", () => {
    // Source: 2:1 gravity take-up: tension = weight / 2 (common practice, no source).
    expect(d.takeUpTension).toBeCloseTo((s.takeUp.mass * G) / 2, 9);
    // The dynamic model starts in that equilibrium and holds it while the chain runs unloaded.
    const r = simulate({ ...s, trains: [{ ...s.trains[0], startPosition: 142 }], run: { ...s.run, duration: 6, segments: 30 } }, { frameBudget: 40 });
    const legs = r.layout.takeUpStation;
    const legSeg = r.layout.stations.length % 2 === 1 ? [legs] : [legs - 1, legs];
    for (const seg of legSeg) expect(r.frames[0].tensions[seg]).toBeCloseTo(T0, 6);
    // Unloaded steady running (no friction here): the weight rings about its start after the ramp (the chain's
    // own inertia during the ramp), so compare means over whole seconds: within 2 mm, legs at m·g/2 within 1 %.
    const sel = r.frames.filter((f) => f.t >= 3);
    const meanY = sel.reduce((a, f) => a + f.takeUpPosition, 0) / sel.length;
    expect(Math.abs(meanY)).toBeLessThan(0.002);
    for (const seg of legSeg) {
      const meanT = sel.reduce((a, f) => a + f.tensions[seg], 0) / sel.length;
      expect(Math.abs(meanT - T0) / T0).toBeLessThan(0.01);
    }
  });

  it("reports a take-up that reaches an end stop", () => {
    const r = simulate(scenario({ takeUp: { travel: 0.2, position: 0.1 }, run: { duration: 25, segments: 30 } }), { frameBudget: 0, series: false });
    expect(r.summary.takeUpEndStop).toBe(true);
    expect(r.notes.join(" ")).toMatch(/end stop/);
    // The stop holds the drop near the travel left below the weight (contact compression only).
    expect(r.summary.takeUpMaxDrop).toBeLessThan(0.1 + 0.02);
  });

  it("gives the tight-side tension T0 + F + 0 (own weight cancels round the strands)", () => {
    // Source: statics of the loop: tension grows by μ·g·Δz and the dog load F; the return strand
    // descends the same height. F = m·g·(sin θ + C_rr cos θ) with the whole train on the incline.
    const F = M * G * (Math.sin(th) + s.trains[0].rollingResistance * Math.cos(th));
    expect(Math.abs(d.worst.dogLoad - F) / F).toBeLessThan(1e-9);
    expect(Math.abs(d.worst.driveTension - (T0 + F)) / (T0 + F)).toBeLessThan(1e-6);
    // Highest tension at the top: T0 + μ·g·H + F.
    const H = (to - from) * Math.sin(th);
    expect(Math.abs(d.worst.maxTension - (T0 + mu * G * H + F)) / d.worst.maxTension).toBeLessThan(1e-6);
  });

  it("stretches the loaded chain by ΣT·L/(E·A)", () => {
    // Source: δ = T·L/(E·A) (Gere & Goodno), integrated: loaded length from the dog up to the top
    // (T = T0 + F + μ·g·z) and down the return strand to the drive.
    const dogQ = d.worst.trainPosition - s.trains[0].dogOffset - from;
    const Lc = to - from;
    const F = d.worst.dogLoad;
    const a = dogQ;
    // ∫_a^Lc (T0 + F + μ g sinθ q) dq + ∫_0^Lc (T0 + F + μ g sinθ q) dq
    const up = (T0 + F) * (Lc - a) + 0.5 * mu * G * Math.sin(th) * (Lc * Lc - a * a);
    const down = (T0 + F) * Lc + 0.5 * mu * G * Math.sin(th) * Lc * Lc;
    const expected = (up + down) / EA;
    expect(Math.abs(d.loadedStretch - expected) / expected).toBeLessThan(0.002); // grid of 0.25 m
    expect(d.loadedLength).toBeCloseTo(2 * Lc - dogQ, 6);
    // The take-up budget takes half of the load's stretch (2:1).
    expect(d.takeUp.elasticExcursion).toBeCloseTo(d.loadStretch / 2, 12);
  });

  it("takes the counterweight's drop at the longest loaded length, not at the worst drive tension", () => {
    // Source: δ = F·L/(E·A) (Gere & Goodno) of the added load F over the loaded length L = dog → top → drive;
    // the drop is largest where F·L is, i.e. low on the lift (the definition changed: it was taken with the
    // train at the worst drive tension, the top, which underestimates the drop).
    const Lc = to - from;
    const closed = d.cases.map((c) => (c.dogLoad * (2 * Lc - (c.trainPosition - s.trains[0].dogOffset - from))) / EA);
    d.cases.forEach((c, i) => expect(Math.abs(c.loadStretch - closed[i]) / closed[i]).toBeLessThan(0.002));
    const most = Math.max(...closed);
    expect(Math.abs(d.loadStretch - most) / most).toBeLessThan(0.002);
    const atWorst = (d.worst.dogLoad * (2 * Lc - (d.worst.trainPosition - s.trains[0].dogOffset - from))) / EA;
    expect(d.loadStretch).toBeGreaterThanOrEqual(atWorst * (1 - 1e-9));
    expect(d.loadStretchPosition).toBe(d.cases[closed.indexOf(most)].trainPosition);
  });

  it("prices the drive: P = T·v/η, torque = T·D/2, safety factor on breaking strength", () => {
    const F = d.worst.dogLoad;
    expect(d.drivePull).toBeCloseTo(F, 3);
    expect(d.motorPower).toBeCloseTo((F * s.drive.speed) / s.drive.efficiency, 3);
    expect(d.torque).toBeCloseTo((F * d.pitchDiameter) / 2, 3);
    expect(d.safetyFactor).toBeCloseTo(s.chain.breakingStrength / d.worst.maxTension, 9);
  });

  it("adds wear and thermal growth to the travel budget", () => {
    const Ltot = 2 * (to - from) + 4;
    // Source: wear allowance 3 % elongation (common practice, no source); thermal α·ΔT·L with α = 11.7e-6 /K (from memory).
    expect(d.takeUp.wearAllowance).toBeCloseTo((0.03 * Ltot) / 2, 12);
    expect(d.takeUp.thermal).toBeCloseTo((11.7e-6 * 40 * Ltot) / 2, 12);
    expect(d.takeUp.required).toBeCloseTo(d.takeUp.elasticExcursion + d.takeUp.wearAllowance + d.takeUp.thermal, 12);
  });

  it("agrees with the dynamic run's steady drive tension", () => {
    // The dynamic steady-climb tension of the example (whole train on the incline) against the statics at
    // chain speed; 2 %: ringing of the unfrictioned pick-up in the averaging window.
    const ex = scenario({ run: { duration: 40, segments: 30 } });
    const r = simulate(ex, { frameBudget: 0, series: false });
    const st = designStatics(ex);
    expect(Math.abs(r.summary.steadyTension! - st.worst.driveTension) / st.worst.driveTension).toBeLessThan(0.02);
  });

  it("a heavy lift chain of about 120 m loaded stretches 450–600 mm at working load", () => {
    // Source: common practice, no source (docs/references.md [practice]: "on the order of" 450–600 mm for about
    // 120 m / 400 ft). The example's chain (15 kg/m, E·A 1.5e7 N) and lift with the chain run out onto the
    // exit, train at its worst position (working load). Tolerance: the range widened by 10 % ("on the order of").
    const lift2 = { approachLength: 15, sagRadius: 30, angle: 40, inclineLength: 50, crestRadius: 25, exitLength: 40, bottomRun: 4 };
    const t2 = buildTrack({ ...lift2, chainFrom: 0, chainTo: 0, dogRelease: 0 });
    const chainTo = t2.exitStart;
    const d2 = designStatics(scenario({ lift: { ...lift2, chainFrom: 10, chainTo, dogRelease: chainTo - 1 } }));
    expect(d2.loadedLength).toBeGreaterThan(100);
    expect(d2.loadedLength).toBeLessThan(130);
    expect(d2.loadedStretch).toBeGreaterThan(0.45 * 0.9);
    expect(d2.loadedStretch).toBeLessThan(0.6 * 1.1);
  });
});
