/**
 * Every train on the track: its cars (from the front back, on the side away from the ground), its dog
 * (amber while it bears on a catch point) and, with several trains, its number beside the nose.
 */
import type { FrameTrainView, FrameView } from "../frames";
import { screenAxes, trackScreen, type Scene } from "./scene";
import { AMBER, FONT_BOLD, PALE, polygon, type Shape } from "./shapes";

/** Gap left at each end of a car, m (so the cars read as separate). */
export const CAR_GAP = 0.1;
/** Car height drawn, m (at least 6 px). */
export const CAR_HEIGHT = 1.1;
/** Train number this far beyond the car's top, px. */
export const TRAIN_LABEL_GAP = 6;

/**
 * The trains of a frame view. A frame saved before per-train frames existed holds train 1 only, in its flat
 * keys (its one pawl carried when the ARD force was positive).
 */
export function frameTrains(f: FrameView): FrameTrainView[] {
  if (f.trains) return f.trains;
  return [{ position: f.trainPosition, present: true, dogEngaged: f.dogEngaged, ardForce: f.ardForce, ardTeeth: [f.ardTooth], ardPawl: f.ardForce > 0 ? 0 : null }];
}

export function carHeightPx(scene: Pick<Scene, "v">): number {
  return Math.max(6, CAR_HEIGHT * scene.v.k);
}

export function paintTrains(scene: Scene, f: FrameView): Shape[] {
  const out: Shape[] = [];
  const carH = carHeightPx(scene);
  const onTrack = frameTrains(f);
  const many = scene.scenario.trains.length > 1;
  scene.scenario.trains.forEach((tr, i) => {
    const ft = onTrack[i];
    if (!ft || !ft.present) return;
    const front = ft.position;
    for (let k = 0; k < tr.cars; k++) {
      const a = trackScreen(scene, front - (k + 1) * tr.carLength + CAR_GAP);
      const b = trackScreen(scene, front - k * tr.carLength - CAR_GAP);
      const na = screenAxes(a.phi);
      const nb = screenAxes(b.phi);
      out.push(
        polygon(
          [
            { x: a.x, y: a.y - 1 },
            { x: b.x, y: b.y - 1 },
            { x: b.x + nb.nx * carH, y: b.y + nb.ny * carH },
            { x: a.x + na.nx * carH, y: a.y + na.ny * carH },
          ],
          { fill: k === 0 ? "#2a4258" : "#1a2f42", part: "car", train: i, index: k },
        ),
      );
    }
    if (many) {
      // Above the nose, beyond the car's height along the normal away from the ground (clear of the track),
      // the text running back over the train on a slope.
      const nose = trackScreen(scene, front);
      const n = screenAxes(nose.phi);
      const off = carH + TRAIN_LABEL_GAP;
      out.push({
        kind: "text",
        x: nose.x + n.nx * off,
        y: nose.y + n.ny * off,
        text: `Train ${i + 1}`,
        fill: "#2a4258",
        font: FONT_BOLD,
        align: n.nx < -0.05 ? "right" : "left",
        baseline: "bottom",
        part: "train-label",
        train: i,
      });
    }
    const dog = trackScreen(scene, front - tr.dogOffset);
    out.push(
      polygon(
        [
          { x: dog.x - 4, y: dog.y },
          { x: dog.x + 4, y: dog.y },
          { x: dog.x, y: dog.y + 7 },
        ],
        { fill: ft.dogEngaged ? AMBER : PALE, part: "dog", train: i, active: ft.dogEngaged },
      ),
    );
  });
  return out;
}
