/**
 * The anti-rollback device: the ratchet's teeth along the track (static), and every pawl of every train
 * at its own place behind the train's front (per frame). The pawl carrying a train (the frame's
 * `ardPawl` while its ARD force is positive) is drawn red, with a ring on its tooth and a label naming it.
 */
import { pawlsOf } from "@/sim/schema";
import type { FrameView } from "../frames";
import { trackLabel } from "./labels";
import { screenAxes, trackScreen, type Scene } from "./scene";
import { ALERT, FONT_BOLD, MUTED, polygon, type Shape } from "./shapes";
import { frameTrains } from "./trains";

/** Ratchet teeth: ticks this far off the track along its normal, m (away from the ground). */
export const TOOTH_FROM = 0.3;
export const TOOTH_TO = 0.9;
/** Pawl drawn: pivot this far off the track along the normal, px; half its width at the pivot, px; tip this far back along the track, px. */
export const PAWL_HEIGHT = 8;
export const PAWL_HALF_WIDTH = 2;
export const PAWL_TIP_BACK = 3;
/** Ring round the carrying pawl's tooth, px, centred this far off the track. */
export const CATCH_RING = 11;
/** A pawl not carrying: pale with a grey outline, seen on the dark cars and on the background. */
export const IDLE_PAWL = "#d5dde4";
export const CATCH_RING_LIFT = 4;

export function paintRatchet(scene: Scene): Shape[] {
  const ar = scene.scenario.antiRollback;
  if (!ar.enabled) return [];
  const { d, v } = scene;
  // At least 3 px between ticks on screen (a fine ratchet drawn at every tooth would be a solid bar).
  const step = Math.max(ar.toothSpacing, (1 / v.k) * 3);
  const paths: number[][] = [];
  for (let s = ar.from; s <= ar.to + 1e-9; s += step) {
    const p = d.trackAt(s);
    const nx = -Math.sin(p.phi);
    const nz = Math.cos(p.phi);
    paths.push([v.sx(p.x + nx * TOOTH_FROM), v.sy(p.z + nz * TOOTH_FROM), v.sx(p.x + nx * TOOTH_TO), v.sy(p.z + nz * TOOTH_TO)]);
  }
  return [{ kind: "lines", paths, stroke: "#b86e00", width: 1, part: "ratchet" }];
}

/** Label of a catch: which train and which pawl when there is a choice. */
export function catchLabel(train: number, trains: number, pawl: number, pawls: number): string {
  const who = [trains > 1 ? `Train ${train + 1}` : "", pawls > 1 ? `pawl ${pawl + 1}` : ""].filter(Boolean).join(", ");
  return who ? `ARD catch · ${who}` : "ARD catch";
}

export function paintPawls(scene: Scene, f: FrameView): Shape[] {
  if (!scene.scenario.antiRollback.enabled) return [];
  const out: Shape[] = [];
  const marks: Shape[] = [];
  const onTrack = frameTrains(f);
  const n = scene.scenario.trains.length;
  scene.scenario.trains.forEach((tr, i) => {
    const ft = onTrack[i];
    if (!ft || !ft.present) return;
    const pawls = pawlsOf(tr);
    const carrying = ft.ardForce > 0 ? ft.ardPawl : null;
    pawls.forEach((offset, k) => {
      const p = trackScreen(scene, ft.position - offset);
      const a = screenAxes(p.phi);
      const active = carrying === k;
      const pivot = { x: p.x + a.nx * PAWL_HEIGHT, y: p.y + a.ny * PAWL_HEIGHT };
      out.push(
        polygon(
          [
            { x: pivot.x - a.tx * PAWL_HALF_WIDTH, y: pivot.y - a.ty * PAWL_HALF_WIDTH },
            { x: pivot.x + a.tx * PAWL_HALF_WIDTH, y: pivot.y + a.ty * PAWL_HALF_WIDTH },
            { x: p.x - a.tx * PAWL_TIP_BACK, y: p.y - a.ty * PAWL_TIP_BACK },
          ],
          { fill: active ? ALERT : IDLE_PAWL, stroke: active ? undefined : MUTED, width: 1, part: "pawl", train: i, index: k, active },
        ),
      );
      const tooth = ft.ardTeeth[k] ?? null;
      if (active && tooth !== null) {
        const q = trackScreen(scene, tooth);
        const qa = screenAxes(q.phi);
        marks.push({ kind: "circle", x: q.x + qa.nx * CATCH_RING_LIFT, y: q.y + qa.ny * CATCH_RING_LIFT, r: CATCH_RING, stroke: ALERT, width: 2, part: "catch-ring", train: i, index: k });
        marks.push(...trackLabel(scene, tooth, catchLabel(i, n, k, pawls.length), ALERT, FONT_BOLD, 30, { part: "catch-label", train: i, index: k }));
      }
    });
  });
  return [...out, ...marks];
}
