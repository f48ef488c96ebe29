/** The side elevation (preview and replay) draws a profile with a first drop below the station to scale. */
import { describe, expect, it } from "vitest";
import { buildLiftDrawing, fitView } from "@/components/replay/geometry";

const profile = [
  { kind: "straight" as const, length: 10, angle: 0 },
  { kind: "arc" as const, radius: 30, toAngle: 20 },
  { kind: "straight" as const, length: 25, angle: 20 },
  { kind: "arc" as const, radius: 40, toAngle: 45 },
  { kind: "straight" as const, length: 40, angle: 45 },
  { kind: "arc" as const, radius: 20, toAngle: -60 },
  { kind: "straight" as const, length: 80, angle: -60 },
];

describe("side elevation of a profile", () => {
  it("keeps the whole drop (below the station) in the bounds, at one scale on both axes", () => {
    const lift = { profile, chainFrom: 8, chainTo: 100, dogRelease: 98, bottomRun: 4 };
    const d = buildLiftDrawing(lift);
    const end = d.track.at(d.track.length);
    // Source: elementary plane geometry (from memory): 80 m at −60° falls 69.3 m, more than the hill's height.
    expect(end.z).toBeLessThan(0);
    expect(d.bounds.minZ).toBeLessThanOrEqual(end.z + 1e-9);
    expect(d.bounds.maxZ).toBeGreaterThanOrEqual(d.track.highest.z - 1e-9);
    const v = fitView(d.bounds, 720, 300, 28);
    for (const p of d.trackPoints) {
      expect(v.sx(p.x)).toBeGreaterThanOrEqual(28 - 1e-6);
      expect(v.sx(p.x)).toBeLessThanOrEqual(720 - 28 + 1e-6);
      expect(v.sy(p.z)).toBeGreaterThanOrEqual(28 - 1e-6);
      expect(v.sy(p.z)).toBeLessThanOrEqual(300 - 28 + 1e-6);
    }
    // To scale: a metre across is as many pixels as a metre up.
    expect(v.sx(1) - v.sx(0)).toBeCloseTo(v.sy(0) - v.sy(1), 9);
    // The end of the drawn track is the end of the profile (the drawing follows the pieces).
    const last = d.trackPoints[d.trackPoints.length - 1];
    expect(last.z).toBeCloseTo(end.z, 9);
  });
});
