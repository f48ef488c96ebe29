/**
 * ARD pawls: a train rolling back onto the ratchet falls at most one tooth spacing with one pawl; with two pawls
 * half a spacing apart one of them always meets a tooth within half a spacing, so the worst rollback halves.
 */
import { describe, expect, it } from "vitest";
import { simulate } from "@/sim/simulate";
import { parseScenario, type Scenario } from "@/sim/schema";
import { G, standingTrain } from "./scenarios";

const TOOTH = 0.15;

/**
 * A train coasting up the incline off the chain (the chain ends below it) at speed u, stopping and rolling back
 * onto the ARD. Returns the rollback less the pawl contact's compression, m.
 */
function rollbackFrom(u: number, pawls: number[]): number {
  const s: Scenario = standingTrain({
    lift: { chainTo: 30, dogRelease: 29 },
    chain: { catchOffset: 10 },
    train: { entrySpeed: u },
    run: { duration: 1.6, segments: 20 },
  });
  s.trains[0].pawls = pawls;
  const r = simulate(s, { frameBudget: 0, series: false }).summary.trains[0];
  expect(r.engagementTime).toBeNull(); // the dog never met the chain
  expect(r.ardCatches).toBeGreaterThanOrEqual(1);
  return r.rollbackDistance - r.peakArdCompression;
}

describe("two pawls half a tooth spacing apart", () => {
  it("halve the worst rollback", () => {
    // Coasting distances sweeping one tooth spacing in tenths: u = √(2·a·d), a = g·(sin θ + C_rr·cos θ).
    const th = (30 * Math.PI) / 180;
    const a = G * (Math.sin(th) + 0.015 * Math.cos(th));
    const d0 = 0.4;
    const speeds = Array.from({ length: 10 }, (_, k) => Math.sqrt(2 * a * (d0 + (k * TOOTH) / 10)));
    const worst = (pawls: number[]) => Math.max(...speeds.map((u) => rollbackFrom(u, pawls)));
    const one = worst([1.3]);
    const two = worst([1.3, 1.3 + TOOTH / 2]);
    // Source: ratchet geometry (common practice, no source): the pawl falls back to the tooth behind it, at most one
    // spacing s; pawls staggered by s/2 put a tooth within s/2 of one of them. A sweep in tenths of s finds the
    // worst case within s/10.
    expect(one).toBeLessThanOrEqual(TOOTH + 1e-3);
    expect(one).toBeGreaterThan(0.85 * TOOTH);
    expect(two).toBeLessThanOrEqual(TOOTH / 2 + 1e-3);
    expect(two).toBeGreaterThan(0.35 * TOOTH);
    expect(Math.abs(two / one - 0.5)).toBeLessThan(0.1);
  });
});

describe("pawls outside the train", () => {
  it("are refused with their path and unit", () => {
    const s = standingTrain();
    const length = s.trains[0].cars * s.trains[0].carLength;
    const doc = { ...s, trains: [{ ...s.trains[0], pawls: [-0.5, 1.3, length + 0.1] }] };
    const r = parseScenario(doc);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const byPath = Object.fromEntries(r.issues.map((i) => [i.path, i.message]));
    expect(byPath["trains.0.pawls.0"]).toBe("trains.0.pawls.0 must be at least 0 (m)");
    expect(byPath["trains.0.pawls.2"]).toContain(`trains.0.pawls.2 must not exceed the train length ${length.toFixed(2)} m`);
    expect(byPath["trains.0.pawls.1"]).toBeUndefined();
  });
});

describe("the replay frames name the pawl that carries the train", () => {
  /** A train coasting `d` m up off the chain, rolling back onto the ARD with the pawls given; its first frame on the ARD. */
  function firstCatch(d: number, pawls: number[]) {
    const s: Scenario = standingTrain({
      lift: { chainTo: 30, dogRelease: 29 },
      chain: { catchOffset: 10 },
      train: { entrySpeed: Math.sqrt(2 * G * (Math.sin(Math.PI / 6) + 0.015 * Math.cos(Math.PI / 6)) * d) },
      run: { duration: 1.6, segments: 20 },
    });
    s.trains[0].pawls = pawls;
    const frames = simulate(s, { frameBudget: 1600, series: false }).frames;
    const f = frames.find((fr) => fr.t > 0 && fr.trains[0].ardForce > 0);
    expect(f).toBeDefined();
    return { from: s.antiRollback.from, front: f!.trains[0].position, tr: f!.trains[0] };
  }

  // Pawl 1 starts on a tooth (standingTrain), pawl 2 half a spacing behind it. After coasting d the pawls sit
  // d mod s and (d + s/2) mod s above the last tooth each passed: the smaller of the two meets its tooth first.
  // Source: ratchet geometry (common practice, no source); coasting distance u²/(2a), a = g(sin θ + C_rr cos θ).
  const cases: [number, number][] = [
    [0.3 + 0.1125, 1], // pawl 2 is 0.0375 m above its tooth, pawl 1 0.1125 m: pawl 2 carries
    [0.3 + 0.0375, 0], // pawl 1 is 0.0375 m above its tooth, pawl 2 0.1125 m: pawl 1 carries
  ];
  for (const [d, carrying] of cases) {
    it(`after ${d.toFixed(4)} m of coasting: pawl ${carrying + 1}`, () => {
      const pawls = [1.3, 1.3 + TOOTH / 2];
      const { from, front, tr } = firstCatch(d, pawls);
      expect(tr.ardPawl).toBe(carrying);
      for (let k = 0; k < 2; k++) {
        const tooth = tr.ardTeeth[k]!;
        // Every tooth named lies on the ratchet's pitch, behind its pawl.
        expect(Math.abs((tooth - from) / TOOTH - Math.round((tooth - from) / TOOTH))).toBeLessThan(1e-6);
        const above = front - pawls[k] - tooth;
        // The carrying pawl bears on its tooth (within the contact's compression); the other stands clear by
        // about half a spacing.
        if (k === carrying) expect(Math.abs(above)).toBeLessThan(2e-3);
        else expect(above).toBeGreaterThan(TOOTH / 2 - 0.02);
      }
    });
  }
});

describe("replay frames at an ARD landing", () => {
  it("keep the step the pawl lands, within the frame budget", () => {
    const s: Scenario = standingTrain({
      lift: { chainTo: 30, dogRelease: 29 },
      chain: { catchOffset: 10 },
      train: { entrySpeed: 2.2 },
      run: { duration: 1.6, segments: 20 },
    });
    s.trains[0].pawls = [1.3];
    // Five regular frames over 1.6 s are 0.4 s apart: far coarser than the landing.
    const r = simulate(s, { frameBudget: 6, series: false });
    const frames = r.frames ?? [];
    expect(frames.length).toBeLessThanOrEqual(6);
    const landing = frames.find((f) => f.ardCatch);
    // Plumbing, not physics: the recorder keeps the first step with a pawl force as its own frame.
    expect(landing).toBeDefined();
    expect(landing!.trains[0].ardForce).toBeGreaterThan(0);
    expect(landing!.trains[0].ardPawl).toBe(0);
    const times = frames.map((f) => f.t);
    expect([...times].sort((a, b) => a - b)).toEqual(times);
  });
});
