/**
 * "Why the train settled back": a plain-language account of an ARD catch computed from the run's own
 * numbers. The chain below the dog carries the train only once it has stretched by the extra tension
 * times its loaded length over E·A; the drive pays that stretch out at chain speed, and until then the
 * train rests on the ARD. Pure (tested in tests/unit/settle-back.test.ts); the sentences are written in
 * the reader's unit system from the one display table (lib/client/units.ts).
 */
import { formatQuantity, type Quantity, type UnitSystem } from "@/lib/client/units";
import type { ProfilePiece } from "@/sim/profile";
import { trackOfPieces } from "@/sim/track";

export interface SettleBackInput {
  /** The incline's slope: `angle` (degrees) of a parametric lift, or the main incline of `profile` (see Track). */
  lift: { angle?: number; profile?: ProfilePiece[] | null; chainFrom: number; chainTo: number };
  chain: { axialStiffness: number };
  drive: { speed: number };
  train: { cars: number; carMass: number; dogOffset: number; rollingResistance: number; entrySpeed: number };
  gravity: number;
  summary: { ardCatches: number; rollbackDistance: number; engagementTime: number | null; pickupDelay: number | null; peakArdForce: number };
  series: { t: readonly number[]; ardForce: readonly number[]; trainPosition: readonly number[]; trainSpeed: readonly number[] };
}

export interface SettleBackAccount {
  /** Speed the train arrived with, m/s. */
  arrivalSpeed: number;
  chainSpeed: number;
  /** Time of the first ARD catch, s. */
  catchTime: number;
  /** Train weight, N, and its pull along the incline (weight component + rolling resistance), N. */
  weight: number;
  pull: number;
  /** Loaded chain from the dog (at the catch) over the top idler down to the drive, m. */
  loadedLength: number;
  /** Stretch needed to carry the pull: pull × loaded length / E·A, m. */
  stretch: number;
  /** Time the drive needs to pay out that stretch: stretch / chain speed, s. */
  stretchTime: number;
  /** Time from the ARD catch to the dog carrying the train, from the run, s (null if never picked up). */
  restTime: number | null;
  rollback: number;
  pickupTime: number | null;
  sentences: string[];
}

/** Null when the run has no ARD catch. */
export function settleBackAccount(x: SettleBackInput, units: UnitSystem = "si"): SettleBackAccount | null {
  // SI keeps the decimals the account was written with; US customary takes each quantity's own.
  const f = (si: number, q: Quantity, siDigits: number) => formatQuantity(si, q, units, units === "si" ? siDigits : undefined);
  if (x.summary.ardCatches < 1) return null;
  const { t, ardForce, trainPosition } = x.series;
  let i = 0;
  while (i < t.length && !(ardForce[i] > 0)) i++;
  if (i >= t.length) return null;
  const catchTime = t[i];
  const mass = x.train.cars * x.train.carMass;
  const weight = mass * x.gravity;
  const th = x.lift.profile?.length ? trackOfPieces(x.lift.profile).angle : ((x.lift.angle ?? 0) * Math.PI) / 180;
  const pull = weight * (Math.sin(th) + x.train.rollingResistance * Math.cos(th));
  const dogAt = trainPosition[i] - x.train.dogOffset;
  const carrying = Math.max(0, x.lift.chainTo - Math.max(x.lift.chainFrom, dogAt));
  const loadedLength = carrying + (x.lift.chainTo - x.lift.chainFrom);
  const stretch = (pull * loadedLength) / x.chain.axialStiffness;
  const V = x.drive.speed;
  const stretchTime = stretch / V;
  const eng = x.summary.engagementTime;
  const pickupTime = eng !== null && x.summary.pickupDelay !== null ? eng + x.summary.pickupDelay : null;
  const restTime = pickupTime !== null && pickupTime > catchTime ? pickupTime - catchTime : null;
  const R = x.summary.rollbackDistance;
  const v0 = x.train.entrySpeed;
  const sentences = [
    v0 > V
      ? `The train reached the chain at ${f(v0, "speed", 2)}, faster than the chain's ${f(V, "speed", 2)}, so it ran ahead of the dogs and slowed on the incline.`
      : `The train reached the chain at ${f(v0, "speed", 2)} against the chain's ${f(V, "speed", 2)}.`,
    `At ${f(catchTime, "time", 2)} it stopped and rolled back ${f(R, "smallLength", 0)} onto the anti-rollback device (peak ARD force ${f(x.summary.peakArdForce, "force", 1)}).`,
    `To carry the train's ${f(pull, "force", 1)} pull on the incline (${f(weight, "force", 1)} weight), the chain had to stretch ${f(stretch, "smallLength", 0)} over its ${f(loadedLength, "length", 1)} of loaded length (pull × length ÷ E·A of ${f(x.chain.axialStiffness, "axialStiffness", 1)}).`,
    `At the chain speed of ${f(V, "speed", 2)} that stretch takes ${f(stretchTime, "time", 2)} to pay out, so the train rested on the ARD ${
      restTime !== null ? `for ${f(restTime, "time", 2)} in the run` : "until the end of the run"
    } after rolling back ${f(R, "smallLength", 0)}${pickupTime !== null ? `, until the dog picked it up at ${f(pickupTime, "time", 2)}` : ""}.`,
  ];
  return {
    arrivalSpeed: v0,
    chainSpeed: V,
    catchTime,
    weight,
    pull,
    loadedLength,
    stretch,
    stretchTime,
    restTime,
    rollback: R,
    pickupTime,
    sentences,
  };
}
