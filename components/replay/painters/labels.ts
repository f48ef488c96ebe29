/**
 * Labels and the scale bar: a label beside the track (off it, on the ground side, with a leader line back
 * to its point), the dog release mark, and a scale bar of a round length in the reader's unit.
 */
import { fromDisplay, toDisplay, unitOf } from "@/lib/client/units";
import { labelBesideTrack, niceLength } from "../geometry";
import type { Scene } from "./scene";
import { ALERT, FONT, INK, MUTED, segment, type Shape, type Tag } from "./shapes";

/** A label `gap` px off the track at position s, its leader line and its text. */
export function trackLabel(scene: Pick<Scene, "d" | "v">, s: number, text: string, colour: string, font: string, gap: number, tag: Tag = {}): Shape[] {
  const l = labelBesideTrack(scene.d, s, scene.v, gap);
  return [
    segment(l.at.x, l.at.y, l.x, l.y, { stroke: colour, width: 1, ...tag, part: `${tag.part ?? "label"}-leader` }),
    { kind: "text", x: l.x + (l.align === "left" ? 3 : -3), y: l.y + 2, text, fill: colour, font, align: l.align, baseline: "top", ...tag, part: tag.part ?? "label" },
  ];
}

/** The dog release mark across the track and its label. */
export function paintReleaseMark(scene: Scene): Shape[] {
  const s = scene.scenario.lift.dogRelease;
  const p = scene.d.trackAt(s);
  const x = scene.v.sx(p.x);
  const y = scene.v.sy(p.z);
  return [segment(x, y - 14, x, y + 6, { stroke: ALERT, width: 1.5, part: "release-mark" }), ...trackLabel(scene, s, "dog release", MUTED, FONT, 24, { part: "release-label" })];
}

/** Distance of the scale bar from the right and bottom edges, px. */
export const SCALE_BAR_INSET = { right: 26, bottom: 14 };

/**
 * The scale bar, fixed to the screen's bottom-right corner: a round length in the reader's unit (20 m, or
 * 50 ft) about an eighth of the visible width, drawn at its true size at magnification `zoom`.
 */
export function paintScaleBar(scene: Scene, zoom = 1): Shape[] {
  const { width, height, units } = scene;
  const k = scene.v.k * Math.max(1, zoom);
  const shown = niceLength(toDisplay(width / k / 8, "length", units));
  const bar = fromDisplay(shown, "length", units);
  const bx = width - SCALE_BAR_INSET.right - bar * k;
  const by = height - SCALE_BAR_INSET.bottom;
  return [
    segment(bx, by, bx + bar * k, by, { stroke: INK, width: 2, part: "scale-bar" }),
    { kind: "text", x: bx + (bar * k) / 2, y: by - 5, text: `${shown} ${unitOf("length", units).label}`, fill: INK, font: FONT, align: "center", baseline: "alphabetic", part: "scale-label" },
  ];
}
