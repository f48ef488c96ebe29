/**
 * Lift profiles (`lift.profile`): a profile written out as the default parametric lift's five pieces runs to the
 * same figures; elevation and slope of a two-slope profile against hand geometry; the checks' messages.
 */
import { describe, expect, it } from "vitest";
import example from "@/sim/examples/lift-hill-example-v2.json";
import { parseScenario } from "@/sim/schema";
import { simulate } from "@/sim/simulate";
import { designStatics } from "@/sim/statics";
import { buildTrack, parametricOfProfile } from "@/sim/track";
import { parametricProfile } from "@/sim/profile";
import { standingTrain } from "./scenarios";

const RAD = Math.PI / 180;

/** The example lift (approach 15 m, sag 30 m to 40°, incline 50 m, crest 25 m, exit 40 m) written as pieces. */
const EXAMPLE_PIECES = [
  { kind: "straight", length: 15, angle: 0 },
  { kind: "arc", radius: 30, toAngle: 40 },
  { kind: "straight", length: 50, angle: 40 },
  { kind: "arc", radius: 25, toAngle: 0 },
  { kind: "straight", length: 40, angle: 0 },
];

function withProfile(profile: unknown[]) {
  const s = structuredClone(example) as Record<string, unknown> & { lift: Record<string, unknown> };
  const { chainFrom, chainTo, dogRelease, bottomRun } = s.lift;
  s.lift = { chainFrom, chainTo, dogRelease, bottomRun, profile };
  return s;
}

const within = (a: number, b: number, rel: number) => expect(Math.abs(a - b)).toBeLessThanOrEqual(rel * Math.max(Math.abs(a), Math.abs(b)) + 1e-9);

describe("a profile equal to the parametric lift", () => {
  it("gives the same run figures and statics (within 1 %)", () => {
    // Source: the format (sim/README.md, "lift.profile"): the parametric fields stand for the five pieces
    // straight 0° – arc to the angle – straight – arc to 0° – straight; the same track must give the same run.
    const opts = { frameBudget: 10 };
    const a = simulate(example, opts).summary;
    const b = simulate(withProfile(EXAMPLE_PIECES), opts).summary;
    expect(a.steadyTension).not.toBeNull();
    within(b.steadyTension!, a.steadyTension!, 0.01);
    within(b.peakTension, a.peakTension, 0.01);
    within(b.peakDriveTension, a.peakDriveTension, 0.01);
    within(b.takeUpMaxDrop, a.takeUpMaxDrop, 0.01);
    within(b.takeUpMaxRise, a.takeUpMaxRise, 0.01);
    within(b.rollbackDistance, a.rollbackDistance, 0.01);
    within(b.trains[0].peakDogForce, a.trains[0].peakDogForce, 0.01);
    expect(b.steadyClimbDuration).toBeCloseTo(a.steadyClimbDuration, 6);
    const sa = designStatics(example);
    const sb = designStatics(withProfile(EXAMPLE_PIECES));
    within(sb.worst.driveTension, sa.worst.driveTension, 0.01);
    within(sb.takeUp.required, sa.takeUp.required, 0.01);
  });
});

describe("the parametric fields nearest a profile", () => {
  it("give back the parametric lift its five pieces stand for", () => {
    // Source: plane geometry (from memory): an arc of radius R turning the slope by θ is R·θ long, so the arc
    // lengths between the named positions give back the radii.
    const lift = { approachLength: 15, sagRadius: 30, angle: 40, inclineLength: 50, crestRadius: 25, exitLength: 40 };
    const back = parametricOfProfile(parametricProfile(lift));
    for (const k of Object.keys(lift) as (keyof typeof lift)[]) expect(back[k]).toBeCloseTo(lift[k], 3);
  });
});

describe("geometry of a two-slope profile", () => {
  // Level 10 m, arc R 40 m to 20°, straight 30 m at 20°, arc R 60 m to 45°, straight 20 m, crest arc R 25 m to
  // −60° (through level), straight 10 m at −60°.
  const pieces = [
    { kind: "straight" as const, length: 10, angle: 0 },
    { kind: "arc" as const, radius: 40, toAngle: 20 },
    { kind: "straight" as const, length: 30, angle: 20 },
    { kind: "arc" as const, radius: 60, toAngle: 45 },
    { kind: "straight" as const, length: 20, angle: 45 },
    { kind: "arc" as const, radius: 25, toAngle: -60 },
    { kind: "straight" as const, length: 10, angle: -60 },
  ];
  const track = buildTrack({ profile: pieces });
  // Hand geometry. Source: elementary plane geometry (from memory): an arc of radius R turning the slope from
  // φ0 to φ rises R·(cos φ0 − cos φ) when concave up (R·(cos φ − cos φ0) over a crest) and has arc length R·|φ − φ0|;
  // a straight of length L at slope θ rises L·sin θ.
  const a1 = 40 * 20 * RAD;
  const z1 = 40 * (1 - Math.cos(20 * RAD));
  const z2 = z1 + 30 * Math.sin(20 * RAD);
  const a3 = 60 * 25 * RAD;
  const z3 = z2 + 60 * (Math.cos(20 * RAD) - Math.cos(45 * RAD));
  const z4 = z3 + 20 * Math.sin(45 * RAD);
  const a5 = 25 * 105 * RAD;
  const s4 = 10 + a1 + 30 + a3 + 20;

  it("has the length of its pieces", () => {
    // Source: elementary plane geometry (from memory), arc length R·Δφ.
    expect(track.length).toBeCloseTo(10 + a1 + 30 + a3 + 20 + a5 + 10, 9);
  });

  it("rises and turns as the hand geometry says", () => {
    // Source: elementary plane geometry (from memory), as above.
    expect(track.elevation(5)).toBe(0);
    expect(track.slope(5)).toBe(0);
    // Halfway round the first arc: slope 10°, rise R(1 − cos 10°).
    expect(track.slope(10 + a1 / 2)).toBeCloseTo(10 * RAD, 12);
    expect(track.elevation(10 + a1 / 2)).toBeCloseTo(40 * (1 - Math.cos(10 * RAD)), 9);
    expect(track.curvature(10 + a1 / 2)).toBeCloseTo(1 / 40, 12);
    // 12 m up the 20° straight.
    expect(track.elevation(10 + a1 + 12)).toBeCloseTo(z1 + 12 * Math.sin(20 * RAD), 9);
    expect(track.slope(10 + a1 + 12)).toBeCloseTo(20 * RAD, 12);
    // 10° into the second arc (slope 30°).
    const sB = 10 + a1 + 30 + 60 * 10 * RAD;
    expect(track.slope(sB)).toBeCloseTo(30 * RAD, 12);
    expect(track.elevation(sB)).toBeCloseTo(z2 + 60 * (Math.cos(20 * RAD) - Math.cos(30 * RAD)), 9);
    // Top of the crest arc (slope 0 after turning 45° at R 25 m): the highest point.
    const sTop = s4 + 25 * 45 * RAD;
    expect(track.slope(sTop)).toBeCloseTo(0, 12);
    expect(track.curvature(sTop)).toBeCloseTo(-1 / 25, 12);
    expect(track.elevation(sTop)).toBeCloseTo(z4 + 25 * (1 - Math.cos(45 * RAD)), 9);
    expect(track.highest.s).toBeCloseTo(sTop, 9);
    expect(track.highest.z).toBeCloseTo(z4 + 25 * (1 - Math.cos(45 * RAD)), 9);
    // End of the drop: 10 m at −60° after the arc down to −60°.
    const zEnd = z4 + 25 * (Math.cos(60 * RAD) - Math.cos(45 * RAD)) - 10 * Math.sin(60 * RAD);
    expect(track.elevation(track.length)).toBeCloseTo(zEnd, 9);
    // Past the end the track runs on straight at −60° (sim/README.md: the end slope continues).
    expect(track.elevation(track.length + 2)).toBeCloseTo(zEnd - 2 * Math.sin(60 * RAD), 9);
    // Horizontal position at the end of the first straight and arc: 10 + R sin 20°.
    expect(track.at(10 + a1).x).toBeCloseTo(10 + 40 * Math.sin(20 * RAD), 9);
  });

  it("names its main incline: the longest uphill straight before the highest point", () => {
    // Source: the definition in sim/README.md ("lift.profile", named positions); common practice, no source.
    expect(track.inclineStart).toBeCloseTo(10 + a1, 9); // the 30 m straight at 20° is longer than the 20 m at 45°
    expect(track.crestStart).toBeCloseTo(10 + a1 + 30, 9);
    expect(track.angle).toBeCloseTo(20 * RAD, 12);
    expect(track.sagStart).toBe(10);
  });
});

describe("checks of a profile", () => {
  const issues = (profile: unknown) => {
    const r = parseScenario(withProfile(profile as unknown[]));
    return r.ok ? [] : r.issues;
  };

  it("refuses a kink, a slope beyond 80° and a zero radius, naming the piece and the unit", () => {
    // Source: the format (sim/README.md, "lift.profile"): slopes within ±80° (the bound of lift.angle),
    // joins without kinks, radius > 0.
    const kink = issues([{ kind: "straight", length: 10, angle: 0 }, { kind: "arc", radius: 30, toAngle: 25 }, { kind: "straight", length: 50, angle: 30 }, { kind: "arc", radius: 25, toAngle: 0 }, { kind: "straight", length: 60, angle: 0 }]);
    expect(kink).toEqual([{ path: "lift.profile.2.angle", message: "lift.profile.2 starts at 30° but the piece before ends at 25°: put an arc between them" }]);
    const steep = issues([{ kind: "straight", length: 10, angle: 0 }, { kind: "arc", radius: 30, toAngle: 85 }, { kind: "straight", length: 150, angle: 85 }]);
    expect(steep.map((i) => [i.path, i.message])).toContainEqual(["lift.profile.1.toAngle", "lift.profile.1.toAngle must be at most 80 (degrees)"]);
    expect(steep.map((i) => [i.path, i.message])).toContainEqual(["lift.profile.2.angle", "lift.profile.2.angle must be at most 80 (degrees)"]);
    const zero = issues([{ kind: "straight", length: 10, angle: 0 }, { kind: "arc", radius: 0, toAngle: 30 }, { kind: "straight", length: 150, angle: 30 }]);
    expect(zero).toContainEqual({ path: "lift.profile.1.radius", message: "lift.profile.1.radius must be greater than 0 (m)" });
  });

  it("refuses an arc that does not turn, an empty list, a first piece off level and a chain beyond the track", () => {
    // Source: the format (sim/README.md, "lift.profile"); common practice, no source.
    const flat = issues([{ kind: "straight", length: 200, angle: 0 }, { kind: "arc", radius: 10, toAngle: 0 }]);
    expect(flat.map((i) => i.path)).toEqual(["lift.profile.1.toAngle"]);
    expect(issues([]).map((i) => i.message)).toEqual(["lift.profile must list at least one piece"]);
    const off = issues([{ kind: "straight", length: 200, angle: 10 }]);
    expect(off[0].message).toMatch(/^lift.profile.0 starts at 10° but the station is level/);
    // The example's chain ends at 122 m; a 100 m track is too short for it.
    const short = issues([{ kind: "straight", length: 100, angle: 0 }]);
    expect(short).toContainEqual({ path: "lift.chainTo", message: "lift.chainTo must not exceed the track length 100.00 m" });
  });

  it("needs the parametric fields only without a profile", () => {
    // Source: the format (sim/README.md, "lift.profile"): with a profile the parametric fields are optional.
    expect(parseScenario(withProfile(EXAMPLE_PIECES)).ok).toBe(true);
    const s = structuredClone(example) as { lift: Record<string, unknown> };
    delete s.lift.sagRadius;
    const r = parseScenario(s);
    expect(r.ok ? [] : r.issues).toEqual([{ path: "lift.sagRadius", message: "lift.sagRadius is required when lift.profile is not given (m)" }]);
  });
});

describe("the release check on a profile with a first drop", () => {
  // The standing train's lift (level 10 m, arc R 20 m to 30°) as pieces, then 40 m at 30°, arc R 30 m to 45°,
  // 20 m at 45°, crest arc R 20 m over the top to −50°, 20 m drop at −50°. The dog lets go on the 45° straight.
  const TH = 30 * RAD;
  const pieces = [
    { kind: "straight", length: 10, angle: 0 },
    { kind: "arc", radius: 20, toAngle: 30 },
    { kind: "straight", length: 40, angle: 30 },
    { kind: "arc", radius: 30, toAngle: 45 },
    { kind: "straight", length: 20, angle: 45 },
    { kind: "arc", radius: 20, toAngle: -50 },
    { kind: "straight", length: 20, angle: -50 },
  ];
  /** Elevation by hand. Source: elementary plane geometry (from memory), as in the two-slope test above. */
  function z(s: number): number {
    const a = 10;
    const b = a + 20 * TH;
    const c = b + 40;
    const d = c + 30 * 15 * RAD;
    const e = d + 20;
    const f = e + 20 * 95 * RAD;
    const zb = 20 * (1 - Math.cos(TH));
    const zc = zb + 40 * Math.sin(TH);
    const zd = zc + 30 * (Math.cos(TH) - Math.cos(45 * RAD));
    const ze = zd + 20 * Math.sin(45 * RAD);
    if (s <= a) return 0;
    if (s <= b) return 20 * (1 - Math.cos((s - a) / 20));
    if (s <= c) return zb + (s - b) * Math.sin(TH);
    if (s <= d) return zc + 30 * (Math.cos(TH) - Math.cos(TH + (s - c) / 30));
    if (s <= e) return zd + (s - d) * Math.sin(45 * RAD);
    if (s <= f) return ze + 20 * (Math.cos(45 * RAD - (s - e) / 20) - Math.cos(45 * RAD));
    return ze + 20 * (Math.cos(50 * RAD) - Math.cos(45 * RAD)) - (s - f) * Math.sin(50 * RAD);
  }

  it("takes the rise from the release to the train's highest point ahead, not to the end of the track", () => {
    const s = standingTrain({
      lift: { profile: pieces, chainTo: 86, dogRelease: 85 },
      antiRollback: { to: 80 },
      drive: { speed: 3, rampTime: 2 },
      run: { duration: 20 },
    });
    expect(s.lift.profile).toEqual(pieces);
    const r = simulate(s, { frameBudget: 0, series: false });
    const rel = r.summary.release!;
    expect(rel).not.toBeNull();
    const t = s.trains[0];
    // Source: work–energy (Meriam & Kraige, Engineering Mechanics: Dynamics, from memory): the train's weight
    // rises from its place at release to where its cars stand highest (every car's centre on the profile).
    const mean = (x: number) => Array.from({ length: t.cars }, (_, k) => z(x - (k + 0.5) * t.carLength)).reduce((a, b) => a + b, 0) / t.cars;
    let best = mean(rel.position);
    for (let x = rel.position; x <= buildTrack({ profile: pieces as never }).length; x += 0.01) best = Math.max(best, mean(x));
    expect(rel.rise).toBeCloseTo(best - mean(rel.position), 2);
    expect(rel.rise).toBeGreaterThan(1); // the crest is still ahead: a real rise to overcome
    expect(rel.margin).not.toBeNull();
  });
});
