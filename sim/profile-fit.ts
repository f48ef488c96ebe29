/**
 * Fits a lift profile (straights joined by tangent arcs, see sim/profile.ts) to survey points (horizontal
 * distance x, height z, m). Method: Douglas–Peucker on the points with a tolerance splits the polyline where
 * its slope changes; each part's least-squares line becomes a straight (neighbours closer than 0.1° are merged);
 * each corner between two straights gets the tangent arc whose radius best fits the points around it (a
 * golden-section search, the arc kept within the halves of its two straights); a first straight that is not
 * level starts with an arc from the level station. The residual is that of the resulting track against every
 * point (vertical deviation). Pure.
 */
import { MAX_ARC_RADIUS, MAX_PIECES, MAX_SLOPE, type ProfilePiece } from "./profile";
import { trackOfPieces, type Track } from "./track";

export interface SurveyPoint {
  /** Horizontal distance, m. */
  x: number;
  /** Height, m. */
  z: number;
}

export interface ProfileFit {
  pieces: ProfilePiece[];
  /** Where the station (s = 0) sits in the survey's coordinates, m. */
  origin: SurveyPoint;
  /** Vertical deviation of the fitted track from the points, m: root mean square and largest. */
  rms: number;
  max: number;
  points: number;
}

export interface FitOptions {
  /** Douglas–Peucker tolerance, m (default 0.1): deviations below it do not start a new straight. */
  tolerance?: number;
}

const DEG = 180 / Math.PI;
const MERGE_ANGLE = 0.1 / DEG;

interface Line {
  i0: number;
  i1: number;
  /** z = a + b·x */
  a: number;
  b: number;
  theta: number;
}

function lineOf(p: readonly SurveyPoint[], i0: number, i1: number): Line {
  const n = i1 - i0 + 1;
  let sx = 0;
  let sz = 0;
  for (let i = i0; i <= i1; i++) {
    sx += p[i].x;
    sz += p[i].z;
  }
  const mx = sx / n;
  const mz = sz / n;
  let sxx = 0;
  let sxz = 0;
  for (let i = i0; i <= i1; i++) {
    sxx += (p[i].x - mx) ** 2;
    sxz += (p[i].x - mx) * (p[i].z - mz);
  }
  const b = sxx > 0 ? sxz / sxx : 0;
  return { i0, i1, a: mz - b * mx, b, theta: Math.atan(b) };
}

/** Indices kept by Douglas–Peucker (perpendicular distance to the chord), in order. */
function douglasPeucker(p: readonly SurveyPoint[], tol: number): number[] {
  const keep = new Uint8Array(p.length);
  keep[0] = 1;
  keep[p.length - 1] = 1;
  const stack: [number, number][] = [[0, p.length - 1]];
  while (stack.length) {
    const [i0, i1] = stack.pop()!;
    const dx = p[i1].x - p[i0].x;
    const dz = p[i1].z - p[i0].z;
    const len = Math.hypot(dx, dz);
    let worst = -1;
    let dmax = 0;
    for (let i = i0 + 1; i < i1; i++) {
      const d = Math.abs(dx * (p[i].z - p[i0].z) - dz * (p[i].x - p[i0].x)) / len;
      if (d > dmax) {
        dmax = d;
        worst = i;
      }
    }
    if (worst >= 0 && dmax > tol) {
      keep[worst] = 1;
      stack.push([i0, worst], [worst, i1]);
    }
  }
  const out: number[] = [];
  keep.forEach((k, i) => k && out.push(i));
  return out;
}

/** Golden-section search for the minimum of f on [lo, hi]. */
function golden(f: (v: number) => number, lo: number, hi: number, iterations = 60): number {
  const g = (Math.sqrt(5) - 1) / 2;
  let a = lo;
  let b = hi;
  let c = b - g * (b - a);
  let d = a + g * (b - a);
  let fc = f(c);
  let fd = f(d);
  for (let k = 0; k < iterations; k++) {
    if (fc < fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - g * (b - a);
      fc = f(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + g * (b - a);
      fd = f(d);
    }
  }
  return (a + b) / 2;
}

/** Height of a circular arc leaving (x0, z0) at slope t0 with curvature k, at horizontal position x. */
function arcZ(x0: number, z0: number, t0: number, k: number, x: number): number {
  const sp = Math.max(-1, Math.min(1, Math.sin(t0) + k * (x - x0)));
  return z0 + (Math.cos(t0) - Math.sqrt(1 - sp * sp)) / k;
}

/** A corner between two lines rounded with radius R: tangent points and the local height function. */
function corner(l1: Line, l2: Line, R: number) {
  const px = (l2.a - l1.a) / (l1.b - l2.b);
  const pz = l1.a + l1.b * px;
  const d = l2.theta - l1.theta;
  const k = Math.sign(d) / R;
  const T = R * Math.tan(Math.abs(d) / 2);
  const ex = px - T * Math.cos(l1.theta);
  const ez = pz - T * Math.sin(l1.theta);
  const fx = px + T * Math.cos(l2.theta);
  const z = (x: number) => (x <= ex ? l1.a + l1.b * x : x >= fx ? l2.a + l2.b * x : arcZ(ex, ez, l1.theta, k, x));
  return { px, ex, fx, z };
}

/** Height of a track (built from s = 0 at the origin) at horizontal position x (slopes within ±80°: x grows with s). */
export function trackHeightAt(track: Track, x: number): number {
  if (x <= 0) return 0;
  const end = track.at(track.length);
  if (x >= end.x) return end.z + (x - end.x) * Math.tan(end.phi);
  let lo = 0;
  let hi = track.length;
  for (let k = 0; k < 60 && hi - lo > 1e-9; k++) {
    const mid = (lo + hi) / 2;
    if (track.at(mid).x < x) lo = mid;
    else hi = mid;
  }
  return track.elevation((lo + hi) / 2);
}

/** v rounded to a multiple of step (0.01, 0.001, …), as a clean decimal. */
const round = (v: number, step: number) => Number((Math.round(v / step) * step).toFixed(Math.max(0, Math.round(-Math.log10(step)))));

/**
 * Fits pieces to survey points (sorted by x, at least 3). Throws an Error in words for points it cannot fit
 * (too few, not increasing in x, steeper than 80°).
 */
export function fitProfile(points: readonly SurveyPoint[], opts: FitOptions = {}): ProfileFit {
  const tol = opts.tolerance ?? 0.1;
  if (points.length < 3) throw new Error("survey points: give at least 3 points (horizontal distance, height)");
  points.forEach((p, i) => {
    if (!Number.isFinite(p.x) || !Number.isFinite(p.z)) throw new Error(`survey point ${i + 1}: distance and height must be numbers (m)`);
    if (i > 0 && !(p.x > points[i - 1].x)) throw new Error(`survey point ${i + 1}: horizontal distances must increase (m)`);
  });
  const p = points;

  // Straights: Douglas–Peucker parts, least-squares lines, nearly parallel neighbours merged.
  const cuts = douglasPeucker(p, tol);
  let lines: Line[] = [];
  for (let k = 0; k + 1 < cuts.length; k++) lines.push(lineOf(p, cuts[k], cuts[k + 1]));
  for (let merged = true; merged && lines.length > 1; ) {
    merged = false;
    for (let k = 0; k + 1 < lines.length; k++) {
      if (Math.abs(lines[k + 1].theta - lines[k].theta) < MERGE_ANGLE) {
        lines = [...lines.slice(0, k), lineOf(p, lines[k].i0, lines[k + 1].i1), ...lines.slice(k + 2)];
        merged = true;
        break;
      }
    }
  }
  for (const l of lines)
    if (Math.abs(l.theta * DEG) > MAX_SLOPE)
      throw new Error(
        `survey points: the slope between ${p[l.i0].x} m and ${p[l.i1].x} m is ${(l.theta * DEG).toFixed(1)}°, beyond ±${MAX_SLOPE}° (degrees)`,
      );
  const mid = (l: Line) => (p[l.i0].x + p[l.i1].x) / 2;
  const sse = (z: (x: number) => number, x0: number, x1: number) => {
    let e = 0;
    for (const q of p) if (q.x >= x0 && q.x <= x1) e += (q.z - z(q.x)) ** 2;
    return e;
  };
  const x0 = p[0].x;
  const xEnd = p[p.length - 1].x;

  // Corners: the radius that best fits the points between the middles of the two straights.
  const corners = lines.slice(1).map((l2, k) => {
    const l1 = lines[k];
    const px = (l2.a - l1.a) / (l1.b - l2.b);
    const half = Math.abs(l2.theta - l1.theta) / 2;
    const tMax = Math.min((px - mid(l1)) / Math.cos(l1.theta), (mid(l2) - px) / Math.cos(l2.theta));
    const rMax = Math.min(MAX_ARC_RADIUS, tMax > 0 ? tMax / Math.tan(half) : 1e-3);
    const rMin = Math.min(rMax, 1e-3);
    const a = mid(l1);
    const b = mid(l2);
    const R = rMax > rMin ? Math.exp(golden((lr) => sse(corner(l1, l2, Math.exp(lr)).z, a, b), Math.log(rMin), Math.log(rMax))) : rMax;
    return { R: round(R, 0.01) || 0.01, l1, l2 };
  });

  // A first straight that is not level starts with an arc from the level station at the first point.
  const first = lines[0];
  let lead: number | null = null;
  if (round(first.theta * DEG, 0.01) !== 0) {
    const s = Math.abs(Math.sin(first.theta));
    const rMax = Math.min(MAX_ARC_RADIUS, Math.max(1e-3, (mid(first) - x0) / s));
    const leadZ = (R: number) => {
      const k = Math.sign(first.theta) / R;
      const xt = x0 + R * s;
      const zs = first.a + first.b * xt - (1 - Math.cos(first.theta)) / k;
      return (x: number) => (x >= xt ? first.a + first.b * x : arcZ(x0, zs, 0, k, x));
    };
    lead = round(Math.exp(golden((lr) => sse(leadZ(Math.exp(lr)), x0, mid(first)), Math.log(Math.min(1e-3, rMax)), Math.log(rMax))), 0.01) || 0.01;
  }

  // Pieces in order, with angles rounded to 0.01° and lengths to the millimetre (the joins stay exact: an arc
  // ends at the very angle the straight after it takes).
  const angleOf = (l: Line) => round(l.theta * DEG, 0.01);
  const pieces: ProfilePiece[] = [];
  let x = x0;
  let zStart = first.a + first.b * x0;
  if (lead !== null) {
    const th = angleOf(first) / DEG;
    pieces.push({ kind: "arc", radius: lead, toAngle: angleOf(first) });
    x = x0 + lead * Math.abs(Math.sin(th));
    zStart = first.a + first.b * x - lead * (1 - Math.cos(th));
  }
  lines.forEach((l, k) => {
    const c = corners[k];
    const th = angleOf(l) / DEG;
    const straightEnd = c ? corner(c.l1, c.l2, c.R).ex : xEnd;
    const len = round((straightEnd - x) / Math.cos(th), 0.001);
    if (len > 0) pieces.push({ kind: "straight", length: len, angle: angleOf(l) });
    if (c) {
      pieces.push({ kind: "arc", radius: c.R, toAngle: angleOf(c.l2) });
      x = corner(c.l1, c.l2, c.R).fx;
    }
  });
  if (pieces.length === 0) pieces.push({ kind: "straight", length: round((xEnd - x0) / Math.cos(first.theta), 0.001) || 0.001, angle: 0 });

  if (pieces.length > MAX_PIECES)
    throw new Error(`survey points: the fit needs ${pieces.length} pieces, more than ${MAX_PIECES}: raise the tolerance (m)`);

  // Residual of the resulting track against every point.
  const track = trackOfPieces(pieces);
  let sum = 0;
  let max = 0;
  for (const q of p) {
    const d = Math.abs(q.z - (zStart + trackHeightAt(track, q.x - x0)));
    sum += d * d;
    max = Math.max(max, d);
  }
  return { pieces, origin: { x: x0, z: zStart }, rms: Math.sqrt(sum / p.length), max, points: p.length };
}
