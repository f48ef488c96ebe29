import { describe, expect, it } from "vitest";
import { chainTensionAtDog, dogSegments, dogTensionAt } from "@/sim/dog-tension";
import { simulate } from "@/sim/simulate";
import { buildTrack } from "@/sim/track";
import { G, scenario, standingTrain } from "./scenarios";

describe("chain tension at the dog in a quasi-static climb", () => {
  // A heavy chain (15 kg/m) so its own weight shows; take-up friction damps the pick-up ringing; no guide
  // friction or drag, so the dog load is exactly weight component + rolling resistance.
  const s = standingTrain({ chain: { massPerLength: 15 }, takeUp: { friction: 1500 }, run: { duration: 30, segments: 120 } });
  const r = simulate(s, { frameBudget: 300 });
  const place = { dogOffset: s.trains[0].dogOffset, dogRelease: s.lift.dogRelease };
  const track = buildTrack(s.lift);
  const th = (s.lift.angle! * Math.PI) / 180;
  const M = s.trains[0].cars * s.trains[0].carMass;
  const w = s.chain.massPerLength * G; // chain weight per metre
  const F = M * G * (Math.sin(th) + s.trains[0].rollingResistance * Math.cos(th));
  const z0 = track.elevation(s.lift.chainFrom);
  const h = r.layout.stations[1] - r.layout.stations[0]; // carrying-strand segment length
  // The steady climb after the pick-up has rung down (the train stays on the incline throughout).
  const steady = r.frames.filter((f) => f.t >= 12);
  const rows = steady.map((f) => {
    const dogAt = f.trainPosition - s.trains[0].dogOffset;
    const seg = dogSegments(r.layout, dogAt, s.lift.dogRelease)!;
    return {
      dog: chainTensionAtDog(r.layout, place, f)!,
      behind: f.tensions[seg.behind],
      drive: f.tensions[r.layout.driveStation - 1],
      leg: f.tensions[r.layout.takeUpStation],
      rise: track.elevation(dogAt) - z0, // height of the dog above the bottom idler
    };
  });
  const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;

  it("jumps across the dog by m·g·(sin θ + C_rr·cos θ)", () => {
    // Source: statics of a body on an incline (Meriam & Kraige, Engineering Mechanics: Statics): the dog
    // holds the train against its weight component and rolling resistance, and the chain takes that load
    // at the catch point. Tolerance 2 %: the two segments either side of the catch point add the weight
    // of up to 2 segment lengths of chain (w·2h·sin θ ≈ 1 % here) and the residual ringing.
    expect(steady.length).toBeGreaterThan(100);
    const jump = mean(rows.map((x) => x.dog - x.behind));
    expect(Math.abs(jump - F) / F).toBeLessThan(0.02);
    for (const x of rows) expect(Math.abs(x.dog - x.behind - F) / F).toBeLessThan(0.05);
  });

  it("is the take-up leg tension plus the chain's weight up to the dog plus the dog load", () => {
    // Source: statics of a chain on a frictionless incline, dT = w·dz (Meriam & Kraige, flexible cables),
    // from the 2:1 take-up leg to the dog, plus the dog load F above. Tolerance: the segment read ahead
    // of the catch point sits up to 1.5 segment lengths higher (w·1.5h·sin θ), and 1 % of F for ringing.
    const tol = w * 1.5 * h * Math.sin(th) + 0.01 * F;
    const off = mean(rows.map((x) => x.dog - (x.leg + w * x.rise + F)));
    expect(Math.abs(off)).toBeLessThan(tol);
    // The value is the whole tension, not the load alone: the pretension of the take-up is in it.
    expect(mean(rows.map((x) => x.dog))).toBeGreaterThan(F + (s.takeUp.mass * G) / 2 * 0.95);
  });

  it("differs from the drive tension by the chain's own weight on the strand below the dog", () => {
    // Source: same statics round the loop. The drive sits at the foot of the return strand, which descends
    // the whole height again, so T_drive = T_leg + F and T_dog − T_drive = w·L·sin θ with L·sin θ the dog's
    // height above the bottom idler (positive: the dog's side of the chain is the higher one).
    const tol = w * 1.5 * h * Math.sin(th) + 0.01 * F;
    const diff = mean(rows.map((x) => x.dog - x.drive));
    const own = mean(rows.map((x) => w * x.rise));
    expect(own).toBeGreaterThan(1000); // the effect is well above the tolerance
    expect(Math.abs(diff - own)).toBeLessThan(tol);
  });
});

describe("chain tension at the dog over a whole run", () => {
  const s = scenario({ run: { duration: 50, segments: 30 } });
  const r = simulate(s, { frameBudget: 200 });
  const place = { dogOffset: s.trains[0].dogOffset, dogRelease: s.lift.dogRelease };
  const at = dogTensionAt(r.layout, place, r.frames, r.series.t);

  it("is a gap where the dog is off the chain (after the release at the crest)", () => {
    expect(at).toHaveLength(r.series.t.length);
    const off = r.series.t.map((_, i) => r.series.trainPosition[i] - s.trains[0].dogOffset >= s.lift.dogRelease);
    expect(off.some(Boolean)).toBe(true);
    // Frames are coarser than the samples: around the release allow one frame spacing of disagreement.
    const spacing = r.frames[1].t - r.frames[0].t;
    const release = r.series.t[off.indexOf(true)];
    r.series.t.forEach((t, i) => {
      if (Math.abs(t - release) <= 1.5 * spacing) return;
      expect(at[i] === null).toBe(off[i]);
    });
  });

  it("passes through the frames' own values", () => {
    const onFrames = dogTensionAt(r.layout, place, r.frames, r.frames.map((f) => f.t));
    r.frames.forEach((f, k) => expect(onFrames[k]).toBe(chainTensionAtDog(r.layout, place, f)));
    expect(onFrames.filter((v) => v !== null).length).toBeGreaterThan(r.frames.length / 2);
    // It is one of the frame's segment tensions, so never above the frame's highest.
    for (const f of r.frames) {
      const v = chainTensionAtDog(r.layout, place, f);
      if (v !== null) expect(v).toBeLessThanOrEqual(Math.max(...f.tensions));
    }
  });
});
