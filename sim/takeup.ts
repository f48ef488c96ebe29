/**
 * Weighted 2:1 gravity take-up: a counterweight on a vertical guide hanging in a bight of the bottom run.
 * y is its downward displacement from the initial position; a drop y lengthens both adjacent legs by y,
 * so the loop grows by 2·y; M·ÿ = M·g − 2·T − F_f·sgn(ẏ) − c·ẏ. End stops are stiff one-way contacts at y = −position (top) and travel − position.
 */
import { contactDampingCoefficient, contactEnergy, contactForce } from "./contacts";
import type { Scenario } from "./schema";
import { FRICTION_SMOOTHING_SPEED } from "./train";

export interface TakeUpModel {
  mass: number;
  yTop: number;
  yBottom: number;
  friction: number;
  /** Dashpot on the weight, N·s/m. */
  damping: number;
  stopStiffness: number;
  stopDamping: number;
  /** Net end-stop force on the weight (positive down). */
  stopForce(y: number, vy: number): number;
  /** Guide friction force on the weight (opposes motion). */
  frictionForce(vy: number): number;
  stopEnergy(y: number): number;
}

export function buildTakeUp(s: Scenario, loopLength: number): TakeUpModel {
  const tu = s.takeUp;
  const EA = s.chain.axialStiffness;
  // Default stop: 20 × the weight's own suspension stiffness (the loop grows 2·y, each leg carries the
  // change: k_own ≈ 4·E·A / loop length), stiff compared with the chain, not needlessly stiffer.
  const k = s.run.endStopStiffness ?? (20 * 4 * EA) / loopLength;
  const c = contactDampingCoefficient(s.contacts.dampingRatio, k, tu.mass);
  const yTop = -tu.position;
  const yBottom = tu.travel - tu.position;
  const vs = FRICTION_SMOOTHING_SPEED;
  return {
    mass: tu.mass,
    yTop,
    yBottom,
    friction: tu.friction,
    damping: tu.damping,
    stopStiffness: k,
    stopDamping: c,
    stopForce(y, vy) {
      // Top stop pushes down (+) when the weight rises above it, bottom stop pushes up.
      return contactForce(k, c, yTop - y, -vy) - contactForce(k, c, y - yBottom, vy);
    },
    frictionForce(vy) {
      return tu.friction > 0 ? (-tu.friction * vy) / Math.sqrt(vy * vy + vs * vs) : 0;
    },
    stopEnergy(y) {
      return contactEnergy(k, yTop - y) + contactEnergy(k, y - yBottom);
    },
  };
}
