/**
 * The plain shapes the replay painters return: screen coordinates (px, y down) and styles, nothing else.
 * The painters never touch a canvas; `drawShapes` (components/replay/draw.ts) renders a list.
 * `part`, `train` and `index` name what a shape stands for (a car, a pawl, a label…), for tests and look-ups.
 */

export interface Style {
  stroke?: string;
  fill?: string;
  width?: number;
  dash?: number[];
  cap?: "butt" | "round" | "square";
  join?: "miter" | "round" | "bevel";
}

export interface Tag {
  part?: string;
  /** Train index in scenario.trains. */
  train?: number;
  /** Index within the train (car, pawl). */
  index?: number;
  /** A pawl carrying the ARD force, a dog on a catch point. */
  active?: boolean;
}

/** Polylines (x, y pairs) stroked (and, closed, filled) with one style: one path per entry. */
export interface LinesShape extends Style, Tag {
  kind: "lines";
  paths: ArrayLike<number>[];
  closed?: boolean;
}

export interface CircleShape extends Style, Tag {
  kind: "circle";
  x: number;
  y: number;
  r: number;
}

/** Many small filled circles (x, y pairs) of one colour. */
export interface DotsShape extends Tag {
  kind: "dots";
  points: ArrayLike<number>;
  r: number;
  fill: string;
}

export interface RectShape extends Style, Tag {
  kind: "rect";
  x: number;
  y: number;
  w: number;
  h: number;
}

export interface TextShape extends Tag {
  kind: "text";
  x: number;
  y: number;
  text: string;
  fill: string;
  font: string;
  align: "left" | "center" | "right";
  baseline: "top" | "middle" | "alphabetic" | "bottom";
}

/** Shapes drawn only inside a rectangle. */
export interface ClipShape extends Tag {
  kind: "clip";
  x: number;
  y: number;
  w: number;
  h: number;
  shapes: Shape[];
}

export type Shape = LinesShape | CircleShape | DotsShape | RectShape | TextShape | ClipShape;

export const FONT = "11px ui-sans-serif, system-ui";
export const FONT_BOLD = "bold 11px ui-sans-serif, system-ui";
export const FONT_MONO = "11px ui-monospace, monospace";

export const INK = "#10202e";
export const MUTED = "#5f7386";
export const ALERT = "#c0392b";
export const AMBER = "#e08a00";
export const PALE = "#a9b6c2";

/** A closed filled polygon from screen points. */
export function polygon(pts: { x: number; y: number }[], style: Style & Tag): LinesShape {
  const a: number[] = [];
  for (const p of pts) a.push(p.x, p.y);
  return { kind: "lines", paths: [a], closed: true, ...style };
}

/** A single straight segment. */
export function segment(x0: number, y0: number, x1: number, y1: number, style: Style & Tag): LinesShape {
  return { kind: "lines", paths: [[x0, y0, x1, y1]], ...style };
}
