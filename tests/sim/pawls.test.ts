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
