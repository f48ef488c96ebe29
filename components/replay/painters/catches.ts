/** Catch points on the carrying strand, moving with the chain (every catchSpacing from the catch offset). */
import type { FrameView } from "../frames";
import type { Scene } from "./scene";
import { INK, type Shape } from "./shapes";

/** Carrying-strand positions (m from chainFrom) of the catch points after `chainTravel` m of chain. */
export function catchPositions(scene: Pick<Scene, "scenario" | "layout">, chainTravel: number): number[] {
  const { chain, lift } = scene.scenario;
  const cs = chain.catchSpacing;
  const off = ((((chain.catchOffset ?? lift.chainFrom) - lift.chainFrom + chainTravel) % cs) + cs) % cs;
  const out: number[] = [];
  for (let q = off; q < scene.layout.strandLength; q += cs) out.push(q);
  return out;
}

export function paintCatches(scene: Scene, f: Pick<FrameView, "chainTravel">): Shape[] {
  const qs = catchPositions(scene, f.chainTravel);
  const pts = new Float32Array(qs.length * 2);
  qs.forEach((q, i) => {
    const p = scene.d.chainPoint(q);
    pts[2 * i] = scene.v.sx(p.x);
    pts[2 * i + 1] = scene.v.sy(p.z);
  });
  return [{ kind: "dots", points: pts, r: 2, fill: INK, part: "catch" }];
}
