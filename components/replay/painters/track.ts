/**
 * Track and chain: the background, ground line, track centre line and top idler (static), and the chain
 * loop coloured by tension band, one polyline set per band, the bottom run following the take-up (per frame).
 */
import { BAND_COLOURS, SLACK_COLOUR, TENSION_BANDS, bandOf } from "../palette";
import type { FrameView } from "../frames";
import { screenPolyline, type Scene } from "./scene";
import { INK, type Shape } from "./shapes";

export const BACKGROUND = "#fbfaf7";

export function paintTrack(scene: Scene): Shape[] {
  const { d, v, width, height } = scene;
  const ground = v.sy(d.bounds.minZ) + 10;
  const track = new Float32Array(d.trackPoints.length * 2);
  d.trackPoints.forEach((p, i) => {
    track[2 * i] = v.sx(p.x);
    track[2 * i + 1] = v.sy(p.z);
  });
  return [
    { kind: "rect", x: 0, y: 0, w: width, h: height, fill: BACKGROUND, part: "background" },
    { kind: "lines", paths: [[0, ground, width, ground]], stroke: "#e3e8ec", width: 1, part: "ground" },
    { kind: "lines", paths: [track], stroke: INK, width: 3, join: "round", part: "track" },
    { kind: "circle", x: v.sx(d.topIdler.x), y: v.sy(d.topIdler.z), r: Math.max(5, d.sprocketRadius * v.k), stroke: INK, width: 1.5, part: "top-idler" },
  ];
}

/**
 * The chain at this frame: segment i in the band of its tension (slack dashed grey); the bottom-run
 * segments follow the take-up's drop (true scale on the main drawing).
 */
export function paintChain(scene: Scene, f: Pick<FrameView, "tensions" | "takeUpPosition">, maxTension: number): Shape[] {
  const { d, v, layout, segs, bottomSegs } = scene;
  const q = layout.stations;
  const paths: Float32Array[] = segs.slice();
  for (const i of bottomSegs) {
    const q1 = i + 1 < q.length ? q[i + 1] : layout.loopLength;
    paths[i] = screenPolyline(d.chainPath(q[i], q1, f.takeUpPosition), v);
  }
  const byBand: Float32Array[][] = Array.from({ length: TENSION_BANDS + 1 }, () => []);
  for (let i = 0; i < paths.length; i++) {
    const T = f.tensions[i] ?? 0;
    byBand[T <= 0 ? 0 : bandOf(T, maxTension) + 1].push(paths[i]);
  }
  const out: Shape[] = [];
  byBand.forEach((ps, b) => {
    if (!ps.length) return;
    const slack = b === 0;
    out.push({
      kind: "lines",
      paths: ps,
      stroke: slack ? SLACK_COLOUR : BAND_COLOURS[b - 1],
      width: 3,
      cap: "round",
      join: "round",
      dash: slack ? [3, 3] : undefined,
      part: slack ? "chain-slack" : "chain",
      index: slack ? undefined : b - 1,
    });
  });
  return out;
}
