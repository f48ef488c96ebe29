/**
 * The zoom of the replay: 1 shows the whole lift; above 1 the drawing is magnified about a centre that
 * follows train 1 every frame when `follow` is set, and otherwise stays where the train was when zoomed.
 */
import { zoomTransform } from "../geometry";
import type { Scene } from "./scene";
import { trackScreen } from "./scene";

export interface ZoomState {
  zoom: number;
  follow: boolean;
}

export interface ViewTransform {
  scale: number;
  x: number;
  y: number;
}

export const IDENTITY: ViewTransform = { scale: 1, x: 0, y: 0 };

/**
 * The transform of the drawing layers and the centre kept for the next call. `recentre` takes the train's
 * place again (the zoom or the follow setting changed).
 */
export function viewTransform(
  scene: Pick<Scene, "d" | "v" | "width" | "height">,
  z: ZoomState,
  trainPosition: number,
  centre: { x: number; y: number } | null,
  recentre: boolean,
): { transform: ViewTransform; centre: { x: number; y: number } | null } {
  if (z.zoom <= 1) return { transform: IDENTITY, centre: null };
  let c = centre;
  if (recentre || z.follow || !c) {
    const p = trackScreen(scene, trainPosition);
    c = { x: p.x, y: p.y };
  }
  return { transform: zoomTransform(z.zoom, c, scene.width, scene.height), centre: c };
}
