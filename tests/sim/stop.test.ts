/**
 * Stops on the lift: a brake stop with a train carried on the incline, against the suddenly stopped
 * spring–mass. A train moving at v on a chain of stiffness k swings about its loaded position when the drive
 * stops; the dog force swings about the load F by v·√(k·m). Below F the chain holds the train; above it the dog
 * unloads and the train rolls back onto the ARD, at most one tooth spacing plus the pawl contact's compression.
 */
import { describe, expect, it } from "vitest";
import { simulate } from "@/sim/simulate";
import type { Scenario } from "@/sim/schema";
import { G, standingTrain } from "./scenarios";

const TOOTH = 0.15;
const PAWL = 1.3; // standingTrain's dog, where its one pawl sits

/** The standing-train lift with a slow ramp (a quasi-static pick-up: little surge at the stop). */
function lift(speed: number, duration: number): Scenario {
  return standingTrain({ drive: { speed, rampTime: 8 }, run: { duration } });
}

/** k, m, F of the standing-train lift for a front position x: from the geometry, E·A and the train's data. */
function springMass(s: Scenario, x: number) {
  const t = s.trains[0];
  const Lc = s.lift.chainTo - s.lift.chainFrom;
  const qDog = x - t.dogOffset - s.lift.chainFrom;
  // Drive at the foot of the return strand: the chain pulling the train runs dog → top → down to the drive.
  const L = 2 * Lc - qDog;
  // Source: Gere & Goodno, Mechanics of Materials — axial stiffness E·A/L; springs in series add compliances.
  const k = 1 / (L / s.chain.axialStiffness + 1 / s.contacts.dogStiffness);
  const m = t.cars * t.carMass;
  const th = (s.lift.angle! * Math.PI) / 180;
  const F = m * G * (Math.sin(th) + t.rollingResistance * Math.cos(th));
  return { k, m, F, L };
}

/** Train position and speed at time t of a run's series. */
function at(r: ReturnType<typeof simulate>, t: number) {
  const i = r.series.t.findIndex((x) => x >= t);
  return { x: r.series.trains[0].position[i], v: r.series.trains[0].speed[i], t: r.series.t[i] };
}

describe("brake stop on the lift", () => {
  it("holds the train when v·√(k·m) < F: no ARD catch, the dog stays loaded", () => {
    const s = lift(0.15, 16);
    // Stop when the pawl is midway between two teeth, so the swing (±v·√(m/k), 5 cm here) meets no tooth.
    const free = simulate(s, { frameBudget: 0 });
    let tStop = 12;
    for (let i = 0; i < free.series.t.length; i++) {
      const t = free.series.t[i];
      if (t < 12) continue;
      const p = free.series.trains[0].position[i] - PAWL - s.antiRollback.from;
      const phase = p / TOOTH - Math.floor(p / TOOTH);
      if (Math.abs(phase - 0.5) < 0.03) {
        tStop = t;
        break;
      }
    }
    const { x, v } = at(free, tStop);
    const { k, m, F } = springMass(s, x);
    // Source: Rao, Mechanical Vibrations — undamped spring–mass released at velocity v: force amplitude v·√(k·m).
    expect(v * Math.sqrt(k * m)).toBeLessThan(0.5 * F);
    expect(v * Math.sqrt(m / k)).toBeLessThan(0.5 * TOOTH);

    s.drive.stop = { time: tStop, kind: "brake", duration: 0.02 };
    const r = simulate(s, { frameBudget: 0 });
    const st = r.summary.trains[0].stop!;
    expect(st).not.toBeNull();
    expect(st.predictsRollback).toBe(false);
    expect(st.dogUnloaded).toBe(false);
    expect(st.ardCatches).toBe(0);
    expect(st.peakArdForce).toBe(0);
    // The summary's figures are the same first-principles quantities.
    expect(st.swingForce).toBeCloseTo(v * Math.sqrt(k * m), -2);
    expect(st.load).toBeCloseTo(F, -2);
    expect(r.summary.stop).toEqual(st);
  });

  it("rolls the train back onto the ARD when v·√(k·m) > F, within one tooth spacing plus the contact's compression", () => {
    const s = lift(3, 24);
    const tStop = 14;
    const free = simulate(s, { frameBudget: 0 });
    const { x, v } = at(free, tStop);
    const { k, m, F, L } = springMass(s, x);
    // Source: Rao, Mechanical Vibrations — the swing v·√(k·m) exceeds the load, so the dog force reaches zero.
    expect(v * Math.sqrt(k * m)).toBeGreaterThan(1.3 * F);

    s.drive.stop = { time: tStop, kind: "brake", duration: 0.02 };
    s.drive.restart = { time: 18 };
    const r = simulate(s, { frameBudget: 0 });
    const st = r.summary.trains[0].stop!;
    expect(st.predictsRollback).toBe(true);
    expect(st.dogUnloaded).toBe(true);
    expect(st.ardCatches).toBeGreaterThanOrEqual(1);
    expect(st.peakArdForce).toBeGreaterThan(F);
    expect(st.rollback).toBeGreaterThan(0);
    // Source: ARD geometry (common practice, no source): the pawl falls on the next tooth behind it.
    expect(st.rollback).toBeLessThanOrEqual(TOOTH + st.peakArdForce / s.contacts.ardStiffness + 1e-3);
    // Restart: the drive must wind in at least the chain's stretch under the load, F·L/(E·A), on its ramp
    // (displacement V·t²/(2·rampTime)) before the dog carries the train again.
    // Source: Gere & Goodno, Mechanics of Materials — δ = F·L/(E·A).
    const stretch = (F * L) / s.chain.axialStiffness;
    const windIn = Math.sqrt((2 * stretch * s.drive.rampTime) / s.drive.speed);
    expect(st.restartTime).toBe(18);
    expect(st.restartToPickup).not.toBeNull();
    expect(st.restartToPickup!).toBeGreaterThanOrEqual(windIn);
  });
});
