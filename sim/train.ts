/**
 * The train: `cars` rigid cars coupled rigidly, one degree of freedom x (front position along the track).
 * Each car's weight acts with the slope under its centre; rolling resistance uses the normal force
 * including the centripetal part on the curves; aerodynamic drag ½·ρ·CdA·v².
 */
import type { Scenario } from "./schema";
import type { Track } from "./track";

/** Speed below which friction-like forces are smoothed (m/s): keeps the model well posed at rest. */
export const FRICTION_SMOOTHING_SPEED = 0.01;

export interface TrainModel {
  mass: number;
  length: number;
  carMass: number;
  /** Offsets of the car centres behind the front. */
  centres: Float64Array;
  /** Net external force along the track at front position x and speed v (gravity, rolling, drag). */
  force(x: number, v: number): number;
  /** Resisting load (weight component + rolling resistance + drag) a dog must overcome to move the train at speed v ≥ 0. */
  resistingLoad(x: number, v: number): number;
  /** Potential energy of the cars, J. */
  potential(x: number): number;
  /** Power dissipated by rolling resistance and drag in the last force() call, W (≥ 0). */
  lastDissipation: number;
  /** Power dissipated by rolling resistance and drag, W (≥ 0). */
  dissipation(x: number, v: number): number;
}

export function buildTrain(s: Scenario, track: Track, index = 0): TrainModel {
  const t = s.trains[index];
  const g = s.run.gravity;
  const mc = t.carMass;
  const centres = new Float64Array(t.cars);
  for (let c = 0; c < t.cars; c++) centres[c] = (c + 0.5) * t.carLength;
  const dragK = 0.5 * s.run.airDensity * t.dragArea;
  const crr = t.rollingResistance;
  const vs = FRICTION_SMOOTHING_SPEED;

  function rolling(x: number, v: number): number {
    // Σ C_rr·|N_c| over the cars, N_c = m·(g·cos φ + v²·κ).
    let n = 0;
    for (let c = 0; c < centres.length; c++) {
      const sc = x - centres[c];
      n += Math.abs(mc * (g * Math.cos(track.slope(sc)) + v * v * track.curvature(sc)));
    }
    return crr * n;
  }
  function gravity(x: number): number {
    let f = 0;
    for (let c = 0; c < centres.length; c++) f -= mc * g * Math.sin(track.slope(x - centres[c]));
    return f;
  }
  const model: TrainModel = {
    lastDissipation: 0,
    mass: mc * t.cars,
    length: t.cars * t.carLength,
    carMass: mc,
    centres,
    force(x, v) {
      const sgn = v / Math.sqrt(v * v + vs * vs);
      const r = rolling(x, v) * sgn;
      const d = dragK * v * Math.abs(v);
      model.lastDissipation = (r + d) * v;
      return gravity(x) - r - d;
    },
    resistingLoad(x, v) {
      const va = Math.max(0, v);
      return -gravity(x) + rolling(x, va) + dragK * va * va;
    },
    potential(x) {
      let e = 0;
      for (let c = 0; c < centres.length; c++) e += mc * g * track.elevation(x - centres[c]);
      return e;
    },
    dissipation(x, v) {
      const sgn = v / Math.sqrt(v * v + vs * vs);
      return rolling(x, v) * sgn * v + dragK * Math.abs(v) * v * v;
    },
  };
  return model;
}
