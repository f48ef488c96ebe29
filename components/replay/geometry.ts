/**
 * The side elevation in world metres (x right, z up): the track from sim/track, the chain loop laid along
 * it (carrying strand just under the track, return strand beneath), and the 2:1 take-up hanging below the
 * drive on the bottom run. Pure: shared by the form preview and the replay canvas.
 */
import { buildTrack, type Track } from "@/sim/track";
import type { LiftSettings } from "@/sim/schema";

export interface Pt {
  x: number;
  z: number;
}

export interface TakeUpSettingsLike {
  travel: number;
  position: number;
}

export interface LiftDrawing {
  track: Track;
  /** Track centre line, sampled (world). */
  trackPoints: Pt[];
  strandLength: number;
  bottomRun: number;
  loopLength: number;
  /** World point of a loop position q (0 … loopLength), with the take-up drop `y` (m, already magnified). */
  chainPoint(q: number, y?: number): Pt;
  /** Polyline of the loop between two loop positions (bends included). */
  chainPath(q0: number, q1: number, y?: number): Pt[];
  /** A point on the track centre line and its slope. */
  trackAt(s: number): Pt & { phi: number };
  drive: Pt;
  topIdler: Pt;
  bottomIdler: Pt;
  /** Take-up sprocket centre at rest (y = 0); it moves down by y. */
  takeUp: Pt;
  sprocketRadius: number;
  /** Guide of the counterweight: the top and bottom stops of the take-up sprocket centre. */
  guideTop: number;
  guideBottom: number;
  bounds: { minX: number; maxX: number; minZ: number; maxZ: number };
}

/** Carrying strand this far under the track, return strand this far (m, measured normal to the track). */
const CARRY_OFFSET = 0.45;
const RETURN_OFFSET = 1.6;
const LEG_SPACING = 0.9;

function offsetPoint(track: Track, s: number, d: number): Pt {
  const p = track.at(s);
  return { x: p.x + d * Math.sin(p.phi), z: p.z - d * Math.cos(p.phi) };
}

/** Arc positions where a polyline along the track needs a vertex (section joints and the sampled curves). */
function trackBreaks(track: Track, s0: number, s1: number, step: number): number[] {
  const lo = Math.min(s0, s1);
  const hi = Math.max(s0, s1);
  const out = [lo];
  for (let s = Math.ceil(lo / step) * step; s < hi; s += step) if (s > lo) out.push(s);
  out.push(hi);
  return s0 <= s1 ? out : out.reverse();
}

export function buildLiftDrawing(lift: LiftSettings, takeUp?: TakeUpSettingsLike, chainPitch = 0.1, teeth = 11): LiftDrawing {
  const track = buildTrack(lift);
  const Lc = lift.chainTo - lift.chainFrom;
  const B = lift.bottomRun;
  const Ltot = 2 * Lc + B;
  const from = lift.chainFrom;
  const step = Math.max(0.5, track.length / 400);

  const trackPoints: Pt[] = [];
  const tStart = -Math.min(10, track.length * 0.05);
  // Regular samples plus every piece joint and the highest point, so the drawing has the profile's corners and top.
  const sampleAt: number[] = [];
  for (let s = tStart; s < track.length; s += step) sampleAt.push(s);
  for (const p of track.pieces) if (p.start > 0) sampleAt.push(p.start);
  sampleAt.push(track.highest.s);
  sampleAt.sort((a, b) => a - b);
  for (const s of sampleAt) {
    if (s >= track.length) continue;
    const p = track.at(Math.max(0, s));
    trackPoints.push(s < 0 ? { x: s, z: 0 } : { x: p.x, z: p.z });
  }
  const end = track.at(track.length);
  trackPoints.push({ x: end.x, z: end.z });

  // Bottom run: return strand end A → down leg → take-up sprocket → up leg → carrying strand start E.
  const A = offsetPoint(track, from, RETURN_OFFSET);
  const E = offsetPoint(track, from, CARRY_OFFSET);
  const rise = Math.hypot(E.x - A.x, E.z - A.z);
  const w = LEG_SPACING;
  const h = Math.max(0.25, (B - rise - 2 * w) / 2);
  const takeUpRest: Pt = { x: A.x - w / 2, z: A.z - h };
  const bottomPoints = (y: number): Pt[] => [
    A,
    { x: A.x, z: A.z - h - y },
    { x: A.x - w, z: A.z - h - y },
    { x: A.x - w, z: E.z },
    E,
  ];
  const polyLen = (pts: Pt[]) => {
    let L = 0;
    for (let i = 1; i < pts.length; i++) L += Math.hypot(pts[i].x - pts[i - 1].x, pts[i].z - pts[i - 1].z);
    return L;
  };
  const alongPolyline = (pts: Pt[], f: number): Pt => {
    const total = polyLen(pts);
    let target = f * total;
    for (let i = 1; i < pts.length; i++) {
      const seg = Math.hypot(pts[i].x - pts[i - 1].x, pts[i].z - pts[i - 1].z);
      if (target <= seg || i === pts.length - 1) {
        const t = seg > 0 ? Math.min(1, target / seg) : 0;
        return { x: pts[i - 1].x + (pts[i].x - pts[i - 1].x) * t, z: pts[i - 1].z + (pts[i].z - pts[i - 1].z) * t };
      }
      target -= seg;
    }
    return pts[pts.length - 1];
  };

  function chainPoint(qIn: number, y = 0): Pt {
    const q = ((qIn % Ltot) + Ltot) % Ltot;
    if (q < Lc) return offsetPoint(track, from + q, CARRY_OFFSET);
    if (q < 2 * Lc) return offsetPoint(track, lift.chainTo - (q - Lc), RETURN_OFFSET);
    return alongPolyline(bottomPoints(y), (q - 2 * Lc) / B);
  }

  function chainPath(q0: number, q1: number, y = 0): Pt[] {
    const pts: Pt[] = [];
    const push = (p: Pt) => pts.push(p);
    // Split at the strand boundaries so each piece follows its own rule.
    const bounds = [0, Lc, 2 * Lc, Ltot];
    let a = q0;
    while (a < q1 - 1e-9) {
      const nextB = bounds.find((b) => b > a + 1e-9) ?? Ltot;
      const b = Math.min(q1, nextB);
      if (a < Lc) for (const s of trackBreaks(track, from + a, from + b, step)) push(offsetPoint(track, s, CARRY_OFFSET));
      else if (a < 2 * Lc)
        for (const s of trackBreaks(track, lift.chainTo - (a - Lc), lift.chainTo - (b - Lc), step))
          push(offsetPoint(track, s, RETURN_OFFSET));
      else {
        const bp = bottomPoints(y);
        const f0 = (a - 2 * Lc) / B;
        const f1 = (b - 2 * Lc) / B;
        push(alongPolyline(bp, f0));
        // The corners of the bottom run that fall inside (f0, f1).
        let acc = 0;
        const total = polyLen(bp);
        for (let i = 1; i < bp.length - 1; i++) {
          acc += Math.hypot(bp[i].x - bp[i - 1].x, bp[i].z - bp[i - 1].z);
          const f = acc / total;
          if (f > f0 && f < f1) push(bp[i]);
        }
        push(alongPolyline(bp, f1));
      }
      a = b;
    }
    return pts;
  }

  const top = offsetPoint(track, lift.chainTo, (CARRY_OFFSET + RETURN_OFFSET) / 2);
  const sprocketRadius = Math.max(chainPitch / Math.sin(Math.PI / teeth) / 2, 0.3);
  const position = takeUp?.position ?? 0;
  const travel = takeUp?.travel ?? 1;
  const guideTop = takeUpRest.z + position;
  const guideBottom = guideTop - travel;

  let minX = Infinity;
  let maxX = -Infinity;
  let minZ = Infinity;
  let maxZ = -Infinity;
  for (const p of [...trackPoints, takeUpRest, { x: takeUpRest.x, z: guideBottom - 1 }]) {
    minX = Math.min(minX, p.x);
    maxX = Math.max(maxX, p.x);
    minZ = Math.min(minZ, p.z);
    maxZ = Math.max(maxZ, p.z);
  }
  return {
    track,
    trackPoints,
    strandLength: Lc,
    bottomRun: B,
    loopLength: Ltot,
    chainPoint,
    chainPath,
    trackAt: (s) => {
      // Before the station the track runs level, past its end straight on at its end slope (sim/track).
      const p = track.at(s);
      return { x: p.x, z: p.z, phi: p.phi };
    },
    drive: { x: (A.x + E.x) / 2 + 0.0, z: A.z },
    topIdler: top,
    bottomIdler: E,
    takeUp: takeUpRest,
    sprocketRadius,
    guideTop,
    guideBottom,
    bounds: { minX, maxX, minZ, maxZ },
  };
}

/** World → screen transform that fits the bounds into a box, same scale on both axes (to scale). */
export interface View {
  k: number;
  sx(x: number): number;
  sy(z: number): number;
}

export function fitView(b: LiftDrawing["bounds"], width: number, height: number, pad = 24): View {
  const w = Math.max(1, b.maxX - b.minX);
  const h = Math.max(1, b.maxZ - b.minZ);
  const k = Math.min((width - 2 * pad) / w, (height - 2 * pad) / h);
  const ox = pad + ((width - 2 * pad) - w * k) / 2 - b.minX * k;
  const oy = height - pad - ((height - 2 * pad) - h * k) / 2 + b.minZ * k;
  return { k, sx: (x) => ox + x * k, sy: (z) => oy - z * k };
}

/** A round scale-bar length (1, 2, 5 × 10^n m) near a target length. */
export function niceLength(target: number): number {
  const p = Math.pow(10, Math.floor(Math.log10(Math.max(target, 1e-6))));
  for (const m of [1, 2, 5, 10]) if (m * p >= target) return m * p;
  return 10 * p;
}

/**
 * Where a label for a point on the track goes so it does not print over the track: `gap` pixels from
 * the track along its normal on the ground side (below the track, where the chain and the ARD run),
 * with the text aligned away from the track. Screen coordinates (y down). Pure.
 */
export function labelBesideTrack(d: Pick<LiftDrawing, "trackAt">, s: number, v: View, gap = 26): { x: number; y: number; align: "left" | "right"; at: { x: number; y: number } } {
  const p = d.trackAt(s);
  const at = { x: v.sx(p.x), y: v.sy(p.z) };
  // Screen tangent of the track at s: along +s the screen x grows with cos φ and y falls with sin φ.
  const tx = Math.cos(p.phi);
  const ty = -Math.sin(p.phi);
  // The normal pointing down the screen (toward the ground).
  let nx = -ty;
  let ny = tx;
  if (ny < 0) {
    nx = -nx;
    ny = -ny;
  }
  return { x: at.x + nx * gap, y: at.y + ny * gap, align: nx >= 0 ? "left" : "right", at };
}

/**
 * The canvas transform for a zoom of `zoom` × centred on a point of the fitted drawing (screen px),
 * kept inside the drawing: scale, then shift so the point sits mid-canvas unless an edge would show.
 */
export function zoomTransform(zoom: number, center: { x: number; y: number }, width: number, height: number): { scale: number; x: number; y: number } {
  const z = Math.max(1, zoom);
  const clamp = (v: number, lo: number, hi: number) => Math.max(lo, Math.min(hi, v));
  return { scale: z, x: clamp(width / 2 - z * center.x, width - z * width, 0), y: clamp(height / 2 - z * center.y, height - z * height, 0) };
}
