import { describe, expect, it } from "vitest";
import { simulate } from "@/sim/simulate";
import { buildTrack } from "@/sim/track";
import { G, scenario, standingTrain } from "./scenarios";

/** Least-squares slope of y(t) over a window. */
function slope(t: number[], y: number[], a: number, b: number): number {
  let n = 0, st = 0, sy = 0, stt = 0, sty = 0;
  t.forEach((ti, i) => {
    if (ti < a || ti > b) return;
    n++; st += ti; sy += y[i]; stt += ti * ti; sty += ti * y[i];
  });
  const mt = st / n;
  return (sty / n - mt * (sy / n)) / (stt / n - mt * mt);
}

describe("a train standing on the lift is picked up", () => {
  // Take-up friction damps the pick-up oscillation so the steady climb can be compared with statics.
  const s = standingTrain({ takeUp: { friction: 1500 }, run: { duration: 30, segments: 60 } });
  const r = simulate(s, { frameBudget: 0 });
  const EA = s.chain.axialStiffness;
  const th = (s.lift.angle! * Math.PI) / 180;
  const M = s.trains[0].cars * s.trains[0].carMass;
  const F = M * G * (Math.sin(th) + s.trains[0].rollingResistance * Math.cos(th)); // load at the dog
  const Lc = s.lift.chainTo - s.lift.chainFrom;
  const v = s.drive.speed;
  const kc = r.diagnostics.contactStiffness as number; // default dog and pawl contact (documented in sim/README.md)

  it("once the drive has wound in F·L/(E·A) of stretch on the loaded length", () => {
    // Source: axial deformation δ = F·L/(E·A) (Gere & Goodno, Mechanics of Materials) on the loaded length
    // L = dog → top → drive, plus the gap to the catch point and the two contact compressions F/k.
    const dogSettled = s.trains[0].startPosition - s.trains[0].dogOffset; // pawl on its tooth (in 10 tooth spacings)
    const settle = F / kc; // the train rests this far back on the pawl at t = 0
    const L = s.lift.chainTo - dogSettled + Lc;
    const gap = s.chain.catchOffset! - (dogSettled - settle);
    const wound = (F * L) / EA + Math.abs(gap) + F / kc + settle;
    const Tr = s.drive.rampTime;
    const tPick = wound / v + Tr / 2; // drive displacement v·(t − Tr/2) after the ramp
    expect(r.summary.engagementTime).not.toBeNull();
    const measured = r.summary.engagementTime! + r.summary.pickupDelay!;
    // Tolerance: one wave transit L/c: the far-end force climbs in steps of 2·Z·v every 2·L/c.
    const c = Math.sqrt(EA / s.chain.massPerLength);
    expect(Math.abs(measured - tPick)).toBeLessThan(L / c);
  });

  it("and the counterweight drops by half the added stretch, then rises at F·v/(2·E·A)", () => {
    const ser = r.series;
    // Source: 2:1 take-up moves half the chain's elongation (common practice, no source); δ = F·L/(E·A).
    const i = ser.t.findIndex((t) => t >= 20);
    const Lnow = s.lift.chainTo - (ser.trainPosition[i] - s.trains[0].dogOffset) + Lc;
    const drop = (F * Lnow) / (2 * EA);
    expect(Math.abs(ser.takeUpPosition[i] - drop) / drop).toBeLessThan(0.02); // 2 %: residual ringing
    // Source: loaded length shrinks at v, so the counterweight rises at F·v/(2·E·A) (Gere & Goodno; the 2:1 take-up is common practice, no source).
    const creep = slope(ser.t, ser.takeUpPosition, 14, 30);
    const expected = -(F * v) / (2 * EA);
    expect(Math.abs(creep - expected) / Math.abs(expected)).toBeLessThan(0.05); // 5 %: ringing in the window
    // The engine's own steady-climb figure has the same sign and size (its window starts earlier, ringing: 50 %).
    expect(r.summary.takeUpCreepRate!).toBeLessThan(0);
    expect(Math.abs(r.summary.takeUpCreepRate! - expected) / Math.abs(expected)).toBeLessThan(0.5);
  });

  it("with the dog carrying the train's load during the climb", () => {
    const ser = r.series;
    const sel = ser.dogForce.filter((_, k) => ser.t[k] >= 14);
    const mean = sel.reduce((a, b) => a + b, 0) / sel.length;
    // Source: statics on an incline: F = m·g·(sin θ + C_rr·cos θ) (no drag, no guide friction). 1 %.
    expect(Math.abs(mean - F) / F).toBeLessThan(0.01);
  });
});

describe("a spring–mass given a velocity step", () => {
  it("overshoots by v·√(k·m)", () => {
    // A heavy train standing on the level with a light chain: the loaded chain (dog → top → drive) is a
    // spring k = E·A/L, in series with the dog contact, between the train and the drive, which starts at v.
    // A light take-up keeps the slack side at constant tension. Chain mass 0.2 % of the train's.
    const EA = 1.5e7;
    const v = 0.1;
    const cars = 20;
    const carMass = 5000;
    const dog = 60;
    const lift = { approachLength: 100, sagRadius: 20, angle: 30, inclineLength: 50, crestRadius: 20, exitLength: 30, chainFrom: 5, bottomRun: 4 };
    const track = buildTrack({ ...lift, chainTo: 0, dogRelease: 0 });
    const chainTo = track.exitStart;
    const s = scenario({
      lift: { ...lift, chainTo, dogRelease: chainTo - 1 },
      chain: { massPerLength: 0.5, axialStiffness: EA, catchOffset: dog, guideFriction: 0 },
      drive: { speed: v, rampTime: 0 },
      takeUp: { mass: 100, travel: 5, position: 2.5 },
      train: { cars, carMass, carLength: 2.5, dogOffset: 1, rollingResistance: 0, dragArea: 0, entrySpeed: 0, startPosition: dog + 1 },
      antiRollback: { from: 130, to: 140, toothSpacing: 0.15 },
      run: { duration: 3, segments: 120, contactStiffness: 2 * EA },
    });
    const r = simulate(s, { frameBudget: 0, series: false });
    const M = cars * carMass;
    const L = chainTo - dog + (chainTo - lift.chainFrom);
    const k = 1 / (L / EA + 1 / (2 * EA)); // chain and dog contact in series
    // Source: a mass M on a spring k whose far end starts moving at v peaks at v·√(k·M) above its static
    // force (docs/references.md [derived]; Rao, Mechanical Vibrations). Static force here is 0 (level, no resistance).
    const expected = v * Math.sqrt(k * M);
    // Tolerance 5 %: the chain's own waves add steps of about Z·v = √(E·A·μ)·v (3.5 % of the peak here).
    expect(Math.abs(r.summary.peakDogForce - expected) / expected).toBeLessThan(0.05);
  });
});
