/**
 * Figures of a stop on the lift (`drive.stop`, optionally `drive.restart`), per train.
 *
 * The settle-back criterion is that of a suddenly stopped spring–mass (Rao, Mechanical Vibrations, free
 * response to an initial velocity): when the drive stops, the train moving at v on a chain of stiffness k
 * (dog to drive, in series with the dog contact) swings about its loaded position, and the dog force swings
 * about the load F with amplitude v·√(k·m). If v·√(k·m) > F the dog unloads, the train leaves the catch and
 * rolls back onto the ARD; otherwise the chain holds it. A brake slower than a quarter of the swing period
 * 2π·√(m/k), or a power loss that lets the drive coast, lowers the swing: the inequality is then a bound.
 */
import type { LiftSystem, TrainState } from "./rhs";

export interface StopFigures {
  /** When the drive stopped, s, and how ("brake" or "power-loss"). */
  time: number;
  kind: "brake" | "power-loss";
  /** Train speed at the stop, m/s (v). */
  trainSpeed: number;
  /** Stiffness holding the train: chain from the dog to the drive in series with the dog contact, N/m (k). */
  chainStiffness: number;
  /** Train mass, kg (m). */
  trainMass: number;
  /** Load the dog carries at the stop: weight component + rolling resistance + drag, N (F). */
  load: number;
  /** v·√(k·m), N: the swing of the dog force after a sudden stop. */
  swingForce: number;
  /** Period of the swing, 2π·√(m/k), s. */
  swingPeriod: number;
  /** v·√(k·m) > F: the inequality says the dog unloads and the train rolls back onto the ARD. */
  predictsRollback: boolean;
  /** The dog force fell to zero after the stop (the dog unloaded). */
  dogUnloaded: boolean;
  /** After the stop until the pick-up after a restart: ARD catches, the largest ARD force (N), the largest backward travel (m). */
  ardCatches: number;
  peakArdForce: number;
  rollback: number;
  /** When the drive restarted, s (null without drive.restart or when the run ended first). */
  restartTime: number | null;
  /**
   * Restart → pick-up: the dog carries the train's load with the pawl off the ARD and the train PICKUP_TRAVEL above
   * where it rested, s (null without a restart or when it never happened).
   */
  restartToPickup: number | null;
}

/** Travel up from its place at the restart (m) after which a train carried by its dog counts as picked up again. */
export const PICKUP_TRAVEL = 0.01;

/** Length of chain between a dog at carrying-strand position q and the drive, on the side that pulls the train up. */
export function tightLength(sys: LiftSystem, q: number): number {
  const Lc = sys.loop.strandLength;
  return sys.s.drive.location === "top" ? Lc - q : 2 * Lc - q;
}

/** Step-by-step stop figures of one train. */
export class StopRecorder {
  figures: StopFigures | null = null;
  private xMax = -Infinity;
  private catchesAtStop = 0;
  private xRestart = NaN;

  constructor(
    private readonly sys: LiftSystem,
    private readonly train: TrainState,
  ) {}

  /** After each step; `ardCatches` is the train's running count of ARD catches. */
  step(t: number, x: number, vx: number, ardCatches: number): void {
    const stop = this.sys.s.drive.stop;
    if (!stop || t < stop.time || !this.train.active) return;
    const tr = this.train;
    let f = this.figures;
    if (!f) {
      // Only a train the chain carries at the stop has a settle-back to judge.
      if (!(tr.dogForce > 0)) return;
      const sys = this.sys;
      const q = x - tr.dogOffset - sys.chainFrom;
      const k = 1 / (tightLength(sys, q) / sys.EA + 1 / sys.dogStiffness);
      const m = tr.model.mass;
      const v = Math.max(0, vx);
      const load = tr.model.resistingLoad(x, vx);
      f = this.figures = {
        time: t,
        kind: stop.kind,
        trainSpeed: vx,
        chainStiffness: k,
        trainMass: m,
        load,
        swingForce: v * Math.sqrt(k * m),
        swingPeriod: 2 * Math.PI * Math.sqrt(m / k),
        predictsRollback: v * Math.sqrt(k * m) > load,
        dogUnloaded: false,
        ardCatches: 0,
        peakArdForce: 0,
        rollback: 0,
        restartTime: null,
        restartToPickup: null,
      };
      this.catchesAtStop = ardCatches;
    }
    const restart = this.sys.s.drive.restart;
    const restarted = !!restart && t >= restart.time;
    if (!restarted && tr.dogForce <= 0) f.dogUnloaded = true;
    if (restarted) {
      if (f.restartTime === null) {
        f.restartTime = restart.time;
        this.xRestart = x;
      }
      // Carried again: the dog holds the load with the pawl off the ratchet and the train on its way up (waves
      // still ringing in a braked chain tap the dog before that; they are not a pick-up).
      if (
        f.restartToPickup === null &&
        tr.dogForce > 0 &&
        tr.dogForce >= tr.model.resistingLoad(x, vx) &&
        tr.ardForce <= 0 &&
        x - this.xRestart >= PICKUP_TRAVEL
      )
        f.restartToPickup = t - restart.time;
    }
    // The settle-back lasts until the dog carries the train again after a restart.
    if (f.restartToPickup === null) {
      f.ardCatches = ardCatches - this.catchesAtStop;
      if (tr.ardForce > f.peakArdForce) f.peakArdForce = tr.ardForce;
      if (x > this.xMax) this.xMax = x;
      if (this.xMax - x > f.rollback) f.rollback = this.xMax - x;
    }
  }
}
