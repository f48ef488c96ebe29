/**
 * Lift-hill geometry in the vertical plane, by arc position s from the start of the track:
 * flat approach → circular sag up to the lift angle → straight incline → circular crest back to level → flat exit.
 * Beyond both ends the track continues level (a train may hang over the start).
 */
import type { LiftSettings } from "./schema";

export interface TrackPoint {
  /** Horizontal position, m. */
  x: number;
  /** Elevation above the approach, m. */
  z: number;
  /** Slope angle, rad (positive uphill). */
  phi: number;
  /** Signed curvature dφ/ds, 1/m: positive in the sag (concave up), negative over the crest. */
  kappa: number;
}

export interface Track {
  length: number;
  /** Arc positions where the sections change: sag start, incline start, crest start, exit start. */
  sagStart: number;
  inclineStart: number;
  crestStart: number;
  exitStart: number;
  angle: number; // rad
  at(s: number): TrackPoint;
  elevation(s: number): number;
  slope(s: number): number;
  curvature(s: number): number;
}

export function buildTrack(lift: LiftSettings): Track {
  const th = (lift.angle * Math.PI) / 180;
  const Rs = lift.sagRadius;
  const Rc = lift.crestRadius;
  const s1 = lift.approachLength;
  const s2 = s1 + Rs * th;
  const s3 = s2 + lift.inclineLength;
  const s4 = s3 + Rc * th;
  const length = s4 + lift.exitLength;
  const sinT = Math.sin(th);
  const cosT = Math.cos(th);
  // Points at the section joints.
  const x2 = s1 + Rs * sinT;
  const z2 = Rs * (1 - cosT);
  const x3 = x2 + lift.inclineLength * cosT;
  const z3 = z2 + lift.inclineLength * sinT;
  const x4 = x3 + Rc * sinT;
  const z4 = z3 + Rc * (1 - cosT);

  function at(s: number): TrackPoint {
    if (s <= s1) return { x: s, z: 0, phi: 0, kappa: 0 };
    if (s <= s2) {
      const p = (s - s1) / Rs;
      return { x: s1 + Rs * Math.sin(p), z: Rs * (1 - Math.cos(p)), phi: p, kappa: 1 / Rs };
    }
    if (s <= s3) {
      const d = s - s2;
      return { x: x2 + d * cosT, z: z2 + d * sinT, phi: th, kappa: 0 };
    }
    if (s <= s4) {
      const p = th - (s - s3) / Rc; // slope decreasing over the crest
      // Centre of the crest circle lies below the track.
      return {
        x: x3 + Rc * (sinT - Math.sin(p)),
        z: z3 + Rc * (Math.cos(p) - cosT),
        phi: p,
        kappa: -1 / Rc,
      };
    }
    return { x: x4 + (s - s4), z: z4, phi: 0, kappa: 0 };
  }

  function elevation(s: number): number {
    if (s <= s1) return 0;
    if (s <= s2) return Rs * (1 - Math.cos((s - s1) / Rs));
    if (s <= s3) return z2 + (s - s2) * sinT;
    if (s <= s4) return z3 + Rc * (Math.cos(th - (s - s3) / Rc) - cosT);
    return z4;
  }

  function slope(s: number): number {
    if (s <= s1) return 0;
    if (s <= s2) return (s - s1) / Rs;
    if (s <= s3) return th;
    if (s <= s4) return th - (s - s3) / Rc;
    return 0;
  }

  function curvature(s: number): number {
    if (s <= s1 || s > s4) return 0;
    if (s <= s2) return 1 / Rs;
    if (s <= s3) return 0;
    return -1 / Rc;
  }

  return { length, sagStart: s1, inclineStart: s2, crestStart: s3, exitStart: s4, angle: th, at, elevation, slope, curvature };
}
