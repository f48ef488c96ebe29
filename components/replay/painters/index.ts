/**
 * The replay's painters, one per layer, composed in drawing order: what stays put (track, ratchet,
 * release mark), what moves with the frame (chain, catch points, trains, pawls, drive), and the overlay
 * fixed to the screen (take-up detail, scale bar). Each returns plain shapes (./shapes.ts).
 */
import type { FrameView } from "../frames";
import { paintPawls, paintRatchet } from "./ard";
import { paintCatches } from "./catches";
import { paintDrive, paintTakeUp } from "./drive";
import { paintReleaseMark, paintScaleBar } from "./labels";
import type { Scene } from "./scene";
import type { Shape } from "./shapes";
import { paintChain, paintTrack } from "./track";
import { paintTrains } from "./trains";

export { prepareScene, type Scene } from "./scene";
export type { Shape } from "./shapes";

export function paintStatic(scene: Scene): Shape[] {
  return [...paintTrack(scene), ...paintRatchet(scene), ...paintReleaseMark(scene)];
}

export function paintMoving(scene: Scene, f: FrameView, maxTension: number): Shape[] {
  return [...paintChain(scene, f, maxTension), ...paintCatches(scene, f), ...paintTrains(scene, f), ...paintPawls(scene, f), ...paintDrive(scene, f)];
}

export function paintOverlay(scene: Scene, f: FrameView, view: { magnify: number; zoom: number }): Shape[] {
  return [...paintTakeUp(scene, f, view.magnify), ...paintScaleBar(scene, view.zoom)];
}
