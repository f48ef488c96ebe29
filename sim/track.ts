/**
 * Lift-hill geometry in the vertical plane, by arc position s from the station (s = 0, level): a list of
 * pieces (straights and circular arcs, see sim/profile.ts). `lift.profile` gives them; without it the parametric
 * fields stand for five pieces: flat approach → sag arc up to the lift angle → straight incline → crest arc back
 * to level → flat exit. Before the station the track continues level; past its end it continues straight at the
 * slope it ends with (level for the parametric lift), so a train may hang over either end.
 */
import type { LiftSettings } from "./schema";
import { PARAMETRIC_FIELDS, parametricProfile, type ParametricLift, type ProfilePiece } from "./profile";

export interface TrackPoint {
  /** Horizontal position, m. */
  x: number;
  /** Elevation above the station, m. */
  z: number;
  /** Slope angle, rad (positive uphill). */
  phi: number;
  /** Signed curvature dφ/ds, 1/m: positive in a sag (concave up), negative over a crest. */
  kappa: number;
}

/** One piece of a built track: where it starts (s, x, z, slope) and how it runs. */
export interface TrackPiece {
  kind: "straight" | "arc";
  /** Arc position of the piece's start, m, and its length along the track, m. */
  start: number;
  length: number;
  x: number;
  z: number;
  /** Slope at the start and at the end, rad. */
  phi0: number;
  phi1: number;
  /** Curvature, 1/m (0 on a straight; ±1/radius on an arc). */
  kappa: number;
}

export interface Track {
  length: number;
  pieces: TrackPiece[];
  /**
   * Named positions, defined for any profile. The main incline is the longest uphill straight that ends at or
   * before the highest point (for the parametric lift: the incline). inclineStart / crestStart are its start and
   * end; sagStart is the start of the first arc before it; exitStart the end of the arcs that follow it straight
   * away (for the parametric lift: the start of the exit). Without an uphill straight all four sit at the highest
   * point. `angle` is the main incline's slope, rad (0 without one).
   */
  sagStart: number;
  inclineStart: number;
  crestStart: number;
  exitStart: number;
  angle: number; // rad
  /** The highest point of the track (its first arc position at the greatest elevation), m. */
  highest: { s: number; z: number };
  at(s: number): TrackPoint;
  elevation(s: number): number;
  slope(s: number): number;
  curvature(s: number): number;
}

const RAD = Math.PI / 180;

/** The pieces a lift stands for: `lift.profile` when given, else the parametric fields' five pieces. */
/** What a track is built from: a lift section (only its profile or parametric fields are read). */
export type TrackInput = Partial<LiftSettings>;

export function liftPieces(lift: TrackInput): ProfilePiece[] {
  if (lift.profile && lift.profile.length) return lift.profile;
  for (const k of PARAMETRIC_FIELDS)
    if (typeof lift[k] !== "number") throw new Error(`lift.${k} is required when lift.profile is not given`);
  return parametricProfile(lift as Record<(typeof PARAMETRIC_FIELDS)[number], number>);
}

export function buildTrack(lift: TrackInput): Track {
  return trackOfPieces(liftPieces(lift));
}

/** A track from a (valid) list of pieces, starting level at s = 0, x = 0, z = 0. */
export function trackOfPieces(profile: readonly ProfilePiece[]): Track {
  const pieces: TrackPiece[] = [];
  let s = 0;
  let x = 0;
  let z = 0;
  let phi = 0;
  for (const p of profile) {
    if (p.kind === "straight") {
      const a = p.angle * RAD;
      pieces.push({ kind: "straight", start: s, length: p.length, x, z, phi0: a, phi1: a, kappa: 0 });
      x += p.length * Math.cos(a);
      z += p.length * Math.sin(a);
      s += p.length;
      phi = a;
    } else {
      const a = p.toAngle * RAD;
      const k = (a > phi ? 1 : -1) / p.radius;
      const len = p.radius * Math.abs(a - phi);
      pieces.push({ kind: "arc", start: s, length: len, x, z, phi0: phi, phi1: a, kappa: k });
      x += (Math.sin(a) - Math.sin(phi)) / k;
      z += (Math.cos(phi) - Math.cos(a)) / k;
      s += len;
      phi = a;
    }
  }
  const length = s;
  const xEnd = x;
  const zEnd = z;
  const phiEnd = phi;
  const cosEnd = Math.cos(phiEnd);
  const sinEnd = Math.sin(phiEnd);
  const n = pieces.length;
  const starts = new Float64Array(n);
  const kind = new Uint8Array(n); // 0 straight, 1 arc
  const X = new Float64Array(n);
  const Z = new Float64Array(n);
  const P0 = new Float64Array(n);
  const K = new Float64Array(n);
  const C0 = new Float64Array(n); // cos of the start slope (straights: of their slope)
  const S0 = new Float64Array(n);
  pieces.forEach((p, i) => {
    starts[i] = p.start;
    kind[i] = p.kind === "arc" ? 1 : 0;
    X[i] = p.x;
    Z[i] = p.z;
    P0[i] = p.phi0;
    K[i] = p.kappa;
    C0[i] = Math.cos(p.phi0);
    S0[i] = Math.sin(p.phi0);
  });

  // Piece lookup: the last piece found is tried first (the right-hand side asks about nearby positions in turn),
  // then a binary search over the starts.
  const ends = new Float64Array(n);
  for (let i = 0; i < n; i++) ends[i] = i + 1 < n ? starts[i + 1] : Infinity;
  let last = 0;
  function pieceOf(q: number): number {
    const l = last;
    if (q >= starts[l] && q < ends[l]) return l;
    let lo = 0;
    let hi = n - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (starts[mid] <= q) lo = mid;
      else hi = mid - 1;
    }
    return (last = lo);
  }

  function at(q: number): TrackPoint {
    if (q <= 0) return { x: q, z: 0, phi: 0, kappa: 0 };
    if (q >= length) {
      const d = q - length;
      return { x: xEnd + d * cosEnd, z: zEnd + d * sinEnd, phi: phiEnd, kappa: 0 };
    }
    const i = pieceOf(q);
    const d = q - starts[i];
    if (kind[i] === 0) return { x: X[i] + d * C0[i], z: Z[i] + d * S0[i], phi: P0[i], kappa: 0 };
    const k = K[i];
    const p = P0[i] + k * d;
    return { x: X[i] + (Math.sin(p) - S0[i]) / k, z: Z[i] + (C0[i] - Math.cos(p)) / k, phi: p, kappa: k };
  }

  function elevation(q: number): number {
    if (q <= 0) return 0;
    if (q >= length) return zEnd + (q - length) * sinEnd;
    const i = pieceOf(q);
    const d = q - starts[i];
    if (kind[i] === 0) return Z[i] + d * S0[i];
    const k = K[i];
    return Z[i] + (C0[i] - Math.cos(P0[i] + k * d)) / k;
  }

  function slope(q: number): number {
    if (q <= 0) return 0;
    if (q >= length) return phiEnd;
    const i = pieceOf(q);
    return P0[i] + K[i] * (q - starts[i]); // K = 0 on a straight
  }

  function curvature(q: number): number {
    if (q <= 0 || q >= length) return 0;
    return K[pieceOf(q)];
  }

  // The highest point: piece ends, and the top of any arc that turns through level (a crest).
  let highest = { s: 0, z: 0 };
  const consider = (q: number, zq: number) => {
    if (zq > highest.z + 1e-9) highest = { s: q, z: zq };
  };
  for (const p of pieces) {
    if (p.kind === "arc" && p.kappa < 0 && p.phi0 > 0 && p.phi1 < 0) {
      const q = p.start + p.phi0 / -p.kappa;
      consider(q, p.z + (Math.cos(p.phi0) - 1) / p.kappa);
    }
    const e = p.start + p.length;
    consider(e, elevation(Math.min(e, length)));
  }
  if (zEnd > highest.z + 1e-9) highest = { s: length, z: zEnd };

  // The main incline and the positions named after the parametric lift's sections.
  let main = -1;
  pieces.forEach((p, i) => {
    if (p.kind === "straight" && p.phi0 > 0 && p.start + p.length <= highest.s + 1e-9 && (main < 0 || p.length > pieces[main].length)) main = i;
  });
  let sagStart = highest.s;
  let inclineStart = highest.s;
  let crestStart = highest.s;
  let exitStart = highest.s;
  let angle = 0;
  if (main >= 0) {
    const m = pieces[main];
    inclineStart = m.start;
    crestStart = m.start + m.length;
    angle = m.phi0;
    const firstArc = pieces.findIndex((p, i) => i < main && p.kind === "arc");
    sagStart = firstArc >= 0 ? pieces[firstArc].start : inclineStart;
    let j = main + 1;
    while (j < n && pieces[j].kind === "arc") j++;
    exitStart = j < n ? pieces[j].start : length;
  }

  return { length, pieces, sagStart, inclineStart, crestStart, exitStart, angle, highest, at, elevation, slope, curvature };
}

/**
 * The parametric lift closest to a profile in the shape the parametric fields describe: its approach up to the
 * first arc before the main incline, that arc's radius, the main incline's slope and length, the crest arcs'
 * radius and the rest as the exit. A starting point for the parametric fields, not an equivalent of the profile.
 */
export function parametricOfProfile(profile: readonly ProfilePiece[]): ParametricLift {
  const t = trackOfPieces(profile);
  const th = t.angle > 0 ? t.angle : Math.PI / 180;
  const round = (v: number) => Math.round(v * 1000) / 1000;
  return {
    approachLength: round(t.sagStart),
    sagRadius: round(Math.max(1, (t.inclineStart - t.sagStart) / th)),
    angle: round((t.angle * 180) / Math.PI),
    inclineLength: round(Math.max(1, t.crestStart - t.inclineStart)),
    crestRadius: round(Math.max(1, (t.exitStart - t.crestStart) / th)),
    exitLength: round(Math.max(1, t.length - t.exitStart)),
  };
}
