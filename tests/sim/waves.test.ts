import { describe, expect, it } from "vitest";
import { simulate } from "@/sim/simulate";
import { scenario } from "./scenarios";

/**
 * The drive starts at full speed at t = 0 (no ramp) with no train on the chain: a tension step of
 * Z·v = √(E·A·μ)·v runs up the return strand (tight side) and a drop of the same size runs into the
 * bottom run (slack side), at c = √(E·A/μ).
 */
describe("longitudinal waves in the chain", () => {
  const EA = 1.5e7;
  const mu = 15;
  const v = 2.5;
  const s = scenario({
    lift: { bottomRun: 100 },
    chain: { axialStiffness: EA, massPerLength: mu, guideFriction: 0 },
    drive: { speed: v, rampTime: 0 },
    takeUp: { mass: 10000 }, // 49 kN per leg: the slack side stays taut under the 37.5 kN drop
    train: { startPosition: 142, entrySpeed: 0 }, // parked on the exit, never engaged
    run: { duration: 0.16, segments: 324 }, // 1 m segments
  });
  const r = simulate(s, { frameBudget: 642, series: false });
  const c = Math.sqrt(EA / mu); // Source: Kolsky, Stress Waves in Solids: c = √(E·A/μ)
  const Z = Math.sqrt(EA * mu); // Source: Kolsky: impedance Z = √(E·A·μ), force jump Z·Δv
  const frames = r.frames;
  const lay = r.layout;
  const Lc = lay.strandLength;
  const segAt = (q: number) => {
    let best = 0;
    lay.stations.forEach((qs, i) => {
      const mid = qs + ((i + 1 < lay.stations.length ? lay.stations[i + 1] : lay.loopLength) - qs) / 2;
      const bm = lay.stations[best] + ((best + 1 < lay.stations.length ? lay.stations[best + 1] : lay.loopLength) - lay.stations[best]) / 2;
      if (Math.abs(mid - q) < Math.abs(bm - q)) best = i;
    });
    const mid = lay.stations[best] + ((best + 1 < lay.stations.length ? lay.stations[best + 1] : lay.loopLength) - lay.stations[best]) / 2;
    return { seg: best, mid };
  };
  const change = (seg: number) => frames.map((f) => ({ t: f.t, dT: f.tensions[seg] - frames[0].tensions[seg] }));
  const meanIn = (h: { t: number; dT: number }[], a: number, b: number) => {
    const sel = h.filter((p) => p.t >= a && p.t <= b);
    return sel.reduce((x, p) => x + p.dT, 0) / sel.length;
  };

  it("travels up the tight side at c and carries a step of Z·v", () => {
    const { seg, mid } = segAt(Lc + Lc / 2); // half-way down the return strand
    const d = 2 * Lc - mid; // distance from the drive
    const h = change(seg);
    const arrival = h.find((p) => p.dT >= (Z * v) / 2)!.t;
    // Tolerance 5 %: the lumped front rises over a few segment transit times (1 m / 1000 m/s each).
    expect(arrival).toBeGreaterThan((d / c) * 0.95);
    expect(arrival).toBeLessThan((d / c) * 1.05);
    // Plateau before any other wave arrives; tolerance 3 % (ringing of the lumped front, light damping).
    const plateau = meanIn(h, d / c + 0.01, 0.15);
    expect(Math.abs(plateau - Z * v) / (Z * v)).toBeLessThan(0.03);
  });

  it("drops by Z·v on the slack side", () => {
    const { seg, mid } = segAt(2 * Lc + 25); // 25 m into the bottom run, take-up 50 m from the drive
    const d = mid - 2 * Lc;
    const h = change(seg);
    const arrival = h.find((p) => p.dT <= -(Z * v) / 2)!.t;
    expect(Math.abs(arrival - d / c) / (d / c)).toBeLessThan(0.08);
    // Window ends before the echo from the take-up (50 m on) comes back.
    const plateau = meanIn(h, d / c + 0.008, (50 + 25) / c - 0.003);
    expect(Math.abs(plateau + Z * v) / (Z * v)).toBeLessThan(0.03);
  });
});
