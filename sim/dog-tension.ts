/**
 * Chain tension at the dog: the tension of the chain just ahead of the dog's catch point on the carrying
 * strand (the side that pulls the train up), from the per-segment tensions of a replay frame.
 *
 * The dog pushes its catch point between two stations (sim/rhs.ts splits the force between them), so the
 * segment straddling it carries only part of the load; the next segment up is the first that carries all
 * of it, and is the one read here. Off the chained zone (before chainFrom, at or after dogRelease) there is
 * no chain at the dog and the value is null. While the dog rides free over the chain (before pick-up,
 * between clicks) it is the strand tension at the dog's place: the catch point it will meet sees that.
 */
import type { Frame } from "./frames";
import type { Layout } from "./simulate";

export interface DogPlace {
  /** Distance from the train's front to its dog, m (train.dogOffset). */
  dogOffset: number;
  /** Track position where the dog lets go, m (lift.dogRelease). */
  dogRelease: number;
}

export type DogLayout = Pick<Layout, "chainFrom" | "strandLength" | "stations" | "topStation">;

/**
 * Segments just ahead of (towards the top) and just behind (towards the bottom idler) the dog's catch
 * point, for a dog at track position `dogAt`; null when the dog is off the chained zone.
 */
export function dogSegments(layout: DogLayout, dogAt: number, dogRelease: number): { ahead: number; behind: number } | null {
  if (!(dogAt >= layout.chainFrom) || !(dogAt < dogRelease)) return null;
  const q = dogAt - layout.chainFrom;
  const st = layout.stations;
  const n = st.length;
  // Last carrying-strand station at or before q: stations 0…topStation run up the carrying strand and
  // q < strandLength = st[topStation], since dogRelease ≤ chainTo.
  let lo = 0;
  let hi = layout.topStation;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (st[mid] <= q) lo = mid;
    else hi = mid;
  }
  return { ahead: (lo + 1) % n, behind: (lo - 1 + n) % n };
}

/** Chain tension at the dog for one frame, N; null when the dog is off the chained zone. */
export function chainTensionAtDog(layout: DogLayout, place: DogPlace, frame: Pick<Frame, "trainPosition" | "tensions">): number | null {
  const seg = dogSegments(layout, frame.trainPosition - place.dogOffset, place.dogRelease);
  if (!seg) return null;
  const T = frame.tensions[seg.ahead];
  return Number.isFinite(T) ? T : null;
}

/**
 * Chain tension at the dog at the given times (e.g. the series' sample times), N: computed on every frame
 * and interpolated linearly between frames; null where the nearer frame has the dog off the chain.
 * Its time resolution is that of the frames (the replay budget), so a short peak between two frames is
 * smoothed; the frame of peak chain tension is always among them.
 */
export function dogTensionAt(layout: DogLayout, place: DogPlace, frames: readonly Pick<Frame, "t" | "trainPosition" | "tensions">[], t: readonly number[]): (number | null)[] {
  const out: (number | null)[] = new Array(t.length).fill(null);
  if (frames.length === 0) return out;
  const v = frames.map((f) => chainTensionAtDog(layout, place, f));
  const last = frames.length - 1;
  // Samples up to one frame spacing outside the frames' span take the nearest frame (the last frame may
  // fall a little before the run's last sample).
  const spacing = last > 0 ? (frames[last].t - frames[0].t) / last : 0;
  let k = 0;
  for (let i = 0; i < t.length; i++) {
    const x = t[i];
    while (k < last && frames[k + 1].t <= x) k++;
    const a = frames[k];
    if (x < a.t || k === last) {
      out[i] = Math.abs(x - a.t) <= spacing + 1e-9 ? v[k] : null;
      continue;
    }
    const b = frames[k + 1];
    const va = v[k];
    const vb = v[k + 1];
    const span = b.t - a.t;
    const u = span > 0 ? (x - a.t) / span : 0;
    // Across the edge of a gap, the nearer frame decides (as the replay does for the dog's contact state).
    out[i] = va === null || vb === null ? (u > 0.5 ? vb : va) : va + (vb - va) * u;
  }
  return out;
}
