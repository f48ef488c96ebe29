/**
 * "Why the train settled back": a plain-language account of an ARD catch computed from the run's own
 * numbers. The chain below the dog carries the train only once it has stretched by the extra tension
 * times its loaded length over E·A; the drive pays that stretch out at chain speed, and until then the
 * train rests on the ARD. Pure (tested in tests/unit/ui-settle-back.test.ts).
 */
export interface SettleBackInput {
  lift: { angle: number; chainFrom: number; chainTo: number };
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

const f = (v: number, d: number) => v.toFixed(d);

/** Null when the run has no ARD catch. */
export function settleBackAccount(x: SettleBackInput): SettleBackAccount | null {
  if (x.summary.ardCatches < 1) return null;
  const { t, ardForce, trainPosition } = x.series;
  let i = 0;
  while (i < t.length && !(ardForce[i] > 0)) i++;
  if (i >= t.length) return null;
  const catchTime = t[i];
  const mass = x.train.cars * x.train.carMass;
  const weight = mass * x.gravity;
  const th = (x.lift.angle * Math.PI) / 180;
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
      ? `The train reached the chain at ${f(v0, 2)} m/s, faster than the chain's ${f(V, 2)} m/s, so it ran ahead of the dogs and slowed on the incline.`
      : `The train reached the chain at ${f(v0, 2)} m/s against the chain's ${f(V, 2)} m/s.`,
    `At ${f(catchTime, 2)} s it stopped and rolled back ${f(R * 1000, 0)} mm onto the anti-rollback device (peak ARD force ${f(x.summary.peakArdForce / 1000, 1)} kN).`,
    `To carry the train's ${f(pull / 1000, 1)} kN pull on the incline (${f(weight / 1000, 1)} kN weight), the chain had to stretch ${f(stretch * 1000, 0)} mm over its ${f(loadedLength, 1)} m of loaded length (pull × length ÷ E·A of ${f(x.chain.axialStiffness / 1e6, 1)} MN).`,
    `At the chain speed of ${f(V, 2)} m/s that stretch takes ${f(stretchTime, 2)} s to pay out, so the train rested on the ARD ${
      restTime !== null ? `for ${f(restTime, 2)} s in the run` : "until the end of the run"
    } after rolling back ${f(R * 1000, 0)} mm${pickupTime !== null ? `, until the dog picked it up at ${f(pickupTime, 2)} s` : ""}.`,
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
