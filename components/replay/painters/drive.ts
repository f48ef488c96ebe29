/**
 * Drive and take-up: the drive sprocket turning with the chain (four spokes at the frame's sprocket angle),
 * and the take-up detail fixed in the top-left corner: guide, stops and counterweight at `magnify` × the
 * drawing's scale, with the true drop written beside it.
 */
import { formatQuantity } from "@/lib/client/units";
import type { FrameView } from "../frames";
import type { Scene } from "./scene";
import { ALERT, AMBER, FONT_BOLD, FONT_MONO, INK, MUTED, PALE, segment, type Shape } from "./shapes";

export function sprocketRadiusPx(scene: Pick<Scene, "d" | "v">): number {
  return Math.max(8, scene.d.sprocketRadius * scene.v.k);
}

export function paintDrive(scene: Scene, f: Pick<FrameView, "sprocketAngle">): Shape[] {
  const r = sprocketRadiusPx(scene);
  const cx = scene.v.sx(scene.d.drive.x);
  const cy = scene.v.sy(scene.d.drive.z) + r * 0.2;
  const spokes: number[][] = [];
  for (let k = 0; k < 4; k++) {
    const ang = f.sprocketAngle + (k * Math.PI) / 2;
    spokes.push([cx, cy, cx + Math.cos(ang) * r, cy - Math.sin(ang) * r]);
  }
  return [
    { kind: "circle", x: cx, y: cy, r, stroke: INK, width: 1.5, part: "sprocket" },
    { kind: "lines", paths: spokes, stroke: INK, width: 1.5, part: "sprocket-spokes" },
  ];
}

/** The take-up detail box, px. */
export const TAKE_UP_BOX = { x: 12, y: 12, w: 150, h: 150, title: 18, guideX: 44 };

export function paintTakeUp(scene: Scene, f: Pick<FrameView, "takeUpPosition">, magnify: number): Shape[] {
  const tu = scene.scenario.takeUp;
  const { x: bx, y: by, w: bw, h: bh, title } = TAKE_UP_BOX;
  const kk = scene.v.k * magnify;
  const midY = by + title + (bh - title) / 2;
  const gx = bx + TAKE_UP_BOX.guideX;
  const zToY = (z: number) => midY + z * kk; // z = drop below the starting position (m)
  const top = zToY(-tu.position);
  const bottom = zToY(tu.travel - tu.position);
  const y = f.takeUpPosition;
  const wy = zToY(y);
  return [
    { kind: "rect", x: bx, y: by, w: bw, h: bh, fill: "rgba(255,255,255,0.94)", part: "takeup-box" },
    { kind: "rect", x: bx + 0.5, y: by + 0.5, w: bw - 1, h: bh - 1, stroke: PALE, width: 1, part: "takeup-frame" },
    {
      kind: "clip",
      x: bx,
      y: by + title,
      w: bw,
      h: bh - title,
      part: "takeup-detail",
      shapes: [
        { kind: "lines", paths: [[gx - 14, top, gx - 14, bottom], [gx + 14, top, gx + 14, bottom]], stroke: MUTED, width: 2, part: "takeup-guide" },
        { kind: "lines", paths: [[gx - 20, top, gx + 20, top], [gx - 20, bottom, gx + 20, bottom]], stroke: ALERT, width: 2, part: "takeup-stops" },
        segment(gx - 24, midY, gx + 24, midY, { stroke: PALE, width: 2, dash: [2, 2], part: "takeup-rest" }),
        { kind: "rect", x: gx - 11, y: wy - 6, w: 22, h: 12, fill: AMBER, part: "takeup-weight" },
      ],
    },
    { kind: "text", x: bx + 8, y: by + 13, text: `Take-up ×${magnify}`, fill: INK, font: FONT_BOLD, align: "left", baseline: "alphabetic", part: "takeup-title" },
    { kind: "text", x: gx + 30, y: midY - 4, text: y >= 0 ? "down" : "up", fill: "#1a2f42", font: FONT_MONO, align: "left", baseline: "alphabetic", part: "takeup-direction" },
    {
      kind: "text",
      x: gx + 30,
      y: midY + 10,
      text: formatQuantity(Math.abs(y), "smallLength", scene.units, scene.units === "si" ? 1 : 2),
      fill: "#1a2f42",
      font: FONT_MONO,
      align: "left",
      baseline: "alphabetic",
      part: "takeup-value",
    },
  ];
}
