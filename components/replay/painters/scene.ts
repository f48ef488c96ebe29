/**
 * What every replay painter shares: the lift drawn to scale (geometry.ts), the fitted view, the chain's
 * segments as screen polylines, and the scenario and layout they come from. Built once per size; pure.
 */
import type { Layout, Scenario } from "@/sim";
import type { UnitSystem } from "@/lib/client/units";
import { buildLiftDrawing, fitView, type LiftDrawing, type Pt, type View } from "../geometry";

export interface Scene {
  scenario: Scenario;
  layout: Layout;
  d: LiftDrawing;
  v: View;
  width: number;
  height: number;
  units: UnitSystem;
  /** Screen polyline of every chain segment (x, y pairs), at take-up drop 0. */
  segs: Float32Array[];
  /** Segments whose path moves with the take-up (the bottom run). */
  bottomSegs: number[];
}

/** Margin of the fitted drawing, px. */
export const SCENE_PAD = 26;

export function screenPolyline(pts: Pt[], v: View): Float32Array {
  const a = new Float32Array(pts.length * 2);
  pts.forEach((p, i) => {
    a[2 * i] = v.sx(p.x);
    a[2 * i + 1] = v.sy(p.z);
  });
  return a;
}

export function prepareScene(scenario: Scenario, layout: Layout, width: number, height: number, units: UnitSystem = "si"): Scene {
  const d = buildLiftDrawing(scenario.lift, scenario.takeUp, scenario.chain.pitch, scenario.drive.sprocketTeeth);
  const v = fitView(d.bounds, width, height, SCENE_PAD);
  const q = layout.stations;
  const segs: Float32Array[] = [];
  const bottomSegs: number[] = [];
  for (let i = 0; i < q.length; i++) {
    const q1 = i + 1 < q.length ? q[i + 1] : layout.loopLength;
    segs.push(screenPolyline(d.chainPath(q[i], q1), v));
    if (q1 > 2 * layout.strandLength + 1e-9) bottomSegs.push(i);
  }
  return { scenario, layout, d, v, width, height, units, segs, bottomSegs };
}

/** Screen point of track position s. */
export function trackScreen(scene: Pick<Scene, "d" | "v">, s: number): { x: number; y: number; phi: number } {
  const p = scene.d.trackAt(s);
  return { x: scene.v.sx(p.x), y: scene.v.sy(p.z), phi: p.phi };
}

/**
 * Unit vectors on screen (y down) at slope φ: along the track (+s) and its normal away from the ground
 * (the side the cars sit on).
 */
export function screenAxes(phi: number): { tx: number; ty: number; nx: number; ny: number } {
  return { tx: Math.cos(phi), ty: -Math.sin(phi), nx: -Math.sin(phi), ny: -Math.cos(phi) };
}
