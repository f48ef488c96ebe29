/**
 * The release check: at `lift.dogRelease` the dog lets go and the train must coast over the rest of the rise on
 * its own kinetic energy. Energy needed = the rise of the train's weight from release to its highest point ahead
 * (its potential, every car on the track profile) + rolling resistance over that distance (C_rr·m·g per metre, the
 * cos θ ≤ 1 taken as 1: conservative). The margin is kinetic energy / energy needed.
 */
import type { TrainModel } from "./train";

export interface ReleaseFigures {
  /** When and where (train front, m) the dog let go, and the train's speed then, m/s. */
  time: number;
  position: number;
  speed: number;
  /** ½·m·v² at release, J. */
  kineticEnergy: number;
  /** Rise of the train's weight to its highest point ahead, m (potential gain / (m·g)). */
  rise: number;
  /** Potential gain + rolling resistance to the highest point ahead, J. */
  energyNeeded: number;
  /** kineticEnergy / energyNeeded; null when nothing is left to climb. */
  margin: number | null;
  /** First time the dog engaged a catch again after the release (the train fell back onto the chain), s. */
  reengagedAt: number | null;
}

/** Release figures of a train whose dog let go at front position x with speed v. */
export function releaseFigures(model: TrainModel, rollingResistance: number, g: number, trackEnd: number, t: number, x: number, v: number): ReleaseFigures {
  const m = model.mass;
  const p0 = model.potential(x);
  let best = 0;
  let bestAt = x;
  let pMax = p0;
  for (let xi = x; xi <= trackEnd; xi += 0.05) {
    const p = model.potential(xi);
    // The highest point ahead: where the potential stops growing (the flat exit adds nothing but rolling losses).
    if (p > pMax + 1e-6 * m * g) {
      pMax = p;
      bestAt = xi;
    }
  }
  best = pMax - p0 + rollingResistance * m * g * (bestAt - x);
  const ke = 0.5 * m * v * v;
  return {
    time: t,
    position: x,
    speed: v,
    kineticEnergy: ke,
    rise: (pMax - p0) / (m * g),
    energyNeeded: best,
    margin: best > 0 ? ke / best : null,
    reengagedAt: null,
  };
}
