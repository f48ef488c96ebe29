/**
 * The survey-point fit (sim/profile-fit.ts): points sampled from a known profile give back its slopes and a small
 * residual; with measurement noise the residual is about the noise's standard deviation.
 */
import { describe, expect, it } from "vitest";
import { fitProfile, type SurveyPoint } from "@/sim/profile-fit";
import { profileIssues, type ProfilePiece } from "@/sim/profile";
import { trackOfPieces } from "@/sim/track";

/** A two-slope lift with a first drop: level, 20° kicker, 45° incline, crest, level, drop at −60°. */
const KNOWN: ProfilePiece[] = [
  { kind: "straight", length: 12, angle: 0 },
  { kind: "arc", radius: 40, toAngle: 20 },
  { kind: "straight", length: 30, angle: 20 },
  { kind: "arc", radius: 60, toAngle: 45 },
  { kind: "straight", length: 60, angle: 45 },
  { kind: "arc", radius: 25, toAngle: 0 },
  { kind: "straight", length: 8, angle: 0 },
  { kind: "arc", radius: 20, toAngle: -60 },
  { kind: "straight", length: 20, angle: -60 },
];

/** Points every 0.5 m of track, shifted into survey coordinates (x from 3 m, heights from 100 m). */
function sample(noise: () => number): SurveyPoint[] {
  const t = trackOfPieces(KNOWN);
  const out: SurveyPoint[] = [];
  for (let s = 0; s <= t.length; s += 0.5) {
    const p = t.at(s);
    out.push({ x: 3 + p.x, z: 100 + p.z + noise() });
  }
  return out;
}

/** Straights longer than 5 m, in order: the slopes a reader recognises. */
const mainSlopes = (pieces: ProfilePiece[]) => pieces.flatMap((p) => (p.kind === "straight" && p.length > 5 ? [p.angle] : []));

describe("fitting pieces to survey points", () => {
  it("recovers the slopes of a known profile within 0.5° with a residual under 2 cm", () => {
    const fit = fitProfile(sample(() => 0), { tolerance: 0.02 });
    expect(profileIssues(fit.pieces)).toEqual([]);
    // Source: the known profile above (its slopes 0°, 20°, 45°, 0°, −60°); Douglas & Peucker (1973) and the
    // least-squares line (docs/references.md, "Lift profiles") only say how the straights are found.
    const slopes = mainSlopes(fit.pieces);
    const expected = [0, 20, 45, 0, -60];
    expect(slopes.length).toBe(expected.length);
    slopes.forEach((a, i) => expect(Math.abs(a - expected[i])).toBeLessThanOrEqual(0.5));
    // Source: common practice, no source: a survey fit good to a centimetre is as good as the survey.
    expect(fit.rms).toBeLessThan(0.01);
    expect(fit.max).toBeLessThan(0.02);
    expect(fit.origin.x).toBe(3);
    expect(Math.abs(fit.origin.z - 100)).toBeLessThan(0.01);
  });

  it("with noise of σ = 5 cm leaves a residual of about σ", () => {
    // A fixed pseudo-random sequence (Park–Miller) through the Box–Muller transform: normal noise of σ 0.05 m.
    let seed = 12345;
    const uniform = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
    const sigma = 0.05;
    const noise = () => sigma * Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
    const fit = fitProfile(sample(noise), { tolerance: 4 * sigma });
    expect(profileIssues(fit.pieces)).toEqual([]);
    // Source: least squares (docs/references.md, "Lift profiles"): the RMS residual of a model that fits the
    // signal estimates the noise's σ (slightly below it, by the parameters fitted); from memory.
    expect(fit.rms).toBeGreaterThan(0.8 * sigma);
    expect(fit.rms).toBeLessThan(1.2 * sigma);
    // Source: the normal distribution (from memory): among ~500 samples the largest deviation is about 3–4 σ.
    expect(fit.max).toBeLessThan(5 * sigma);
    // The main slopes are still there within 0.5°. Source: the known profile above.
    const slopes = mainSlopes(fit.pieces);
    for (const e of [20, 45, -60]) expect(slopes.some((a) => Math.abs(a - e) <= 0.5)).toBe(true);
  });

  it("says in words what it cannot fit", () => {
    // Source: common practice, no source (a fit needs at least 3 points in order).
    expect(() => fitProfile([{ x: 0, z: 0 }, { x: 1, z: 0 }])).toThrow("give at least 3 points");
    expect(() => fitProfile([{ x: 0, z: 0 }, { x: 2, z: 0 }, { x: 1, z: 0 }])).toThrow("survey point 3: horizontal distances must increase (m)");
    expect(() => fitProfile([{ x: 0, z: 0 }, { x: 1, z: 10 }, { x: 2, z: 20 }])).toThrow(/beyond ±80°/);
  });
});
