/** Frame look-up for a replay clock: binary search, linear interpolation of the scalars and tensions. */
import type { Frame } from "@/sim";

export interface FrameView {
  t: number;
  index: number;
  tensions: Float64Array;
  trainPosition: number;
  trainSpeed: number;
  takeUpPosition: number;
  sprocketAngle: number;
  chainTravel: number;
  dogEngaged: boolean;
  dogForce: number;
  ardForce: number;
  ardTooth: number | null;
  /** Every train (absent in frames saved before per-train frames existed). */
  trains?: FrameTrainView[];
}

/** One train at the replay clock. */
export interface FrameTrainView {
  position: number;
  present: boolean;
  dogEngaged: boolean;
  ardForce: number;
  /** Track position of the tooth under each pawl (null: none yet). */
  ardTeeth: (number | null)[];
  /** Index of the pawl carrying the ARD force, or null. */
  ardPawl: number | null;
}

/** Index of the last frame at or before t. */
export function frameIndexAt(frames: readonly Frame[], t: number): number {
  let lo = 0;
  let hi = frames.length - 1;
  if (hi < 0 || t <= frames[0].t) return 0;
  if (t >= frames[hi].t) return hi;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (frames[mid].t <= t) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** The state at time t, written into `out` (reused between calls to keep the frame loop allocation-free). */
export function frameAt(frames: readonly Frame[], t: number, out?: FrameView): FrameView {
  const i = frameIndexAt(frames, t);
  const a = frames[i];
  const b = frames[Math.min(frames.length - 1, i + 1)];
  const span = b.t - a.t;
  const u = span > 0 ? Math.max(0, Math.min(1, (t - a.t) / span)) : 0;
  const n = a.tensions.length;
  const v: FrameView =
    out && out.tensions.length === n
      ? out
      : {
          t,
          index: i,
          tensions: new Float64Array(n),
          trainPosition: 0,
          trainSpeed: 0,
          takeUpPosition: 0,
          sprocketAngle: 0,
          chainTravel: 0,
          dogEngaged: false,
          dogForce: 0,
          ardForce: 0,
          ardTooth: null,
        };
  const lerp = (x: number, y: number) => x + (y - x) * u;
  for (let k = 0; k < n; k++) v.tensions[k] = lerp(a.tensions[k], b.tensions[k]);
  v.t = t;
  v.index = u > 0.5 ? Math.min(frames.length - 1, i + 1) : i;
  v.trainPosition = lerp(a.trainPosition, b.trainPosition);
  v.trainSpeed = lerp(a.trainSpeed, b.trainSpeed);
  v.takeUpPosition = lerp(a.takeUpPosition, b.takeUpPosition);
  v.chainTravel = lerp(a.chainTravel, b.chainTravel);
  // The sprocket angle wraps at 2π: follow the chain travel instead of interpolating the angle.
  v.sprocketAngle = a.sprocketAngle + (v.chainTravel - a.chainTravel) * (span > 0 && b.chainTravel !== a.chainTravel ? (angleStep(a, b) / (b.chainTravel - a.chainTravel)) : 0);
  const near = u > 0.5 ? b : a;
  v.dogEngaged = near.dogEngaged;
  v.dogForce = lerp(a.dogForce, b.dogForce);
  v.ardForce = near.ardForce;
  v.ardTooth = near.ardTooth;
  v.trains = a.trains?.map((ta, j) => {
    const tb = b.trains?.[j] ?? ta;
    const tn = near.trains?.[j] ?? ta;
    // Frames saved before pawls were listed per train carry train 1's tooth in the flat keys only.
    const teeth = tn.ardTeeth ?? (j === 0 ? [near.ardTooth] : []);
    const ardForce = tn.ardForce ?? (j === 0 ? near.ardForce : 0);
    const ardPawl = tn.ardPawl !== undefined ? tn.ardPawl : ardForce > 0 && teeth[0] != null ? 0 : null;
    return { position: lerp(ta.position, tb.position), present: tn.present, dogEngaged: tn.dogEngaged, ardForce, ardTeeth: teeth, ardPawl };
  });
  return v;
}

function angleStep(a: Frame, b: Frame): number {
  let d = b.sprocketAngle - a.sprocketAngle;
  if (d < -Math.PI) d += 2 * Math.PI;
  if (d > Math.PI) d -= 2 * Math.PI;
  return d;
}
