/**
 * The release check: at lift.dogRelease the train's kinetic energy must carry it over the rest of the rise.
 * The energy needed is checked against the track's geometry by hand (elevation of every car's centre on
 * approach – sag arc – incline – crest arc – exit), and a release too early fails with a re-engagement.
 */
import { describe, expect, it } from "vitest";
import { evaluateChecks } from "@/sim/checks";
import { simulate } from "@/sim/simulate";
import { designStatics } from "@/sim/statics";
import { G, standingTrain } from "./scenarios";

const TH = (30 * Math.PI) / 180;
const SAG = 20;
const CREST = 20;
const APPROACH = 10;
const INCLINE = 40;

/** Elevation of track position s (m) of the standing-train lift with a 40 m incline (geometry by hand). */
function elevation(s: number): number {
  const a = APPROACH;
  const b = a + SAG * TH;
  const c = b + INCLINE;
  const d = c + CREST * TH;
  const zb = SAG * (1 - Math.cos(TH));
  const zc = zb + INCLINE * Math.sin(TH);
  if (s <= a) return 0;
  if (s <= b) return SAG * (1 - Math.cos((s - a) / SAG));
  if (s <= c) return zb + (s - b) * Math.sin(TH);
  // Crest arc: the slope falls from θ to 0, z gains R·(cos φ − cos θ) with φ = θ − (s − c)/R.
  if (s <= d) return zc + CREST * (Math.cos(TH - (s - c) / CREST) - Math.cos(TH));
  return zc + CREST * (1 - Math.cos(TH));
}

function lift(chainTo: number, dogRelease: number) {
  // The ratchet ends a few metres below the release: a train falling back meets the chain, not the ARD.
  return standingTrain({
    lift: { inclineLength: INCLINE, chainTo, dogRelease },
    antiRollback: { to: Math.min(dogRelease - 3, APPROACH + SAG * TH + INCLINE) },
    drive: { speed: 3, rampTime: 2 },
    run: { duration: 14 },
  });
}

describe("release check", () => {
  it("a release on the incline: energy needed from the cars' rise, margin below 1, a re-engagement, the check fails", () => {
    const crestStart = APPROACH + SAG * TH + INCLINE;
    const s = lift(crestStart, crestStart - 1);
    const r = simulate(s, { frameBudget: 0, series: false });
    const rel = r.summary.release!;
    expect(rel).not.toBeNull();
    const t = s.trains[0];
    // Source: work–energy (Meriam & Kraige, Engineering Mechanics: Dynamics, from memory): the weight of every
    // car rises from its place at release to the flat beyond the crest; rolling resistance C_rr·m·g per metre.
    const centres = (x: number) => Array.from({ length: t.cars }, (_, k) => x - (k + 0.5) * t.carLength);
    const top = elevation(1e6);
    const rise = centres(rel.position).reduce((acc, c) => acc + (top - elevation(c)), 0) / t.cars;
    expect(rel.rise).toBeCloseTo(rise, 2);
    const m = t.cars * t.carMass;
    expect(rel.energyNeeded).toBeGreaterThan(m * G * rise);
    expect(rel.kineticEnergy).toBeCloseTo(0.5 * m * rel.speed ** 2, 6);
    expect(rel.margin!).toBeLessThan(1);
    expect(rel.reengagedAt).not.toBeNull();
    const check = evaluateChecks(r.summary, designStatics(s), s.limits).find((c) => c.key === "release")!;
    expect(check.state).toBe("fail");
    expect(check.reason).toMatch(/margin 0\.\d\d \(required 1\.25\).*re-engaged/);
  });

  it("a release on the flat beyond the crest passes", () => {
    const end = APPROACH + SAG * TH + INCLINE + CREST * TH + 20;
    const s = lift(end - 2, end - 3);
    s.run.duration = 30;
    const r = simulate(s, { frameBudget: 0, series: false });
    const rel = r.summary.release!;
    expect(rel).not.toBeNull();
    expect(rel.rise).toBeCloseTo(0, 3); // Source: the exit is level
    expect(rel.reengagedAt).toBeNull();
    expect(evaluateChecks(r.summary, designStatics(s), s.limits).find((c) => c.key === "release")!.state).toBe("pass");
  });
});
