/**
 * "What the stop did": a plain-language account of a stop on the lift (drive.stop, drive.restart) for one
 * train, from the engine's stop figures (sim/stop.ts). It states the inequality that decides a settle-back
 * with the run's numbers: after a sudden stop the dog force swings about the load F with amplitude
 * v·√(k·m) (v the train's speed, k the stiffness of the chain from the dog to the drive with the dog contact,
 * m the train's mass); if v·√(k·m) > F the dog unloads and the train rolls back onto the ARD. Pure; the
 * sentences are written in the reader's unit system from the one display table (lib/client/units.ts).
 */
import { formatQuantity, type Quantity, type UnitSystem } from "@/lib/client/units";
import type { StopFigures } from "@/sim/stop";

export interface StopAccountInput {
  stop: StopFigures;
  /** drive.stop.duration, s (brake: time to rest; power loss: time until the brake holds). */
  duration: number | null;
  /** The train's own series, to find the first ARD catch after the stop. */
  series: { t: readonly number[]; ardForce: readonly number[] };
}

export interface StopAccount {
  /** When the train first came onto the ARD after the stop, s (null: it never did). */
  catchTime: number | null;
  /** When the dog carried it again after the restart, s (null: no restart or no pick-up in the run). */
  pickupTime: number | null;
  /** v·√(k·m) > F, as the engine judged it. */
  predictsRollback: boolean;
  /** The inequality with its numbers, e.g. "87.4 kN > 49.9 kN". */
  inequality: string;
  sentences: string[];
}

export function stopAccount(x: StopAccountInput, units: UnitSystem = "si"): StopAccount {
  const f = (si: number, q: Quantity, siDigits?: number) => formatQuantity(si, q, units, units === "si" ? siDigits : undefined);
  const s = x.stop;
  const { t, ardForce } = x.series;
  let i = 0;
  while (i < t.length && !(t[i]! >= s.time && ardForce[i]! > 0)) i++;
  const catchTime = i < t.length ? t[i]! : null;
  const pickupTime = s.restartTime !== null && s.restartToPickup !== null ? s.restartTime + s.restartToPickup : null;
  const swing = f(s.swingForce, "force", 1);
  const load = f(s.load, "force", 1);
  const inequality = `${swing} ${s.predictsRollback ? ">" : "≤"} ${load}`;
  const how =
    s.kind === "brake"
      ? `the drive braked the chain to rest${x.duration !== null ? ` in ${f(x.duration, "time", 2)}` : ""}`
      : `the drive lost power${x.duration !== null ? ` (the brake held the sprocket after ${f(x.duration, "time", 2)})` : ""}`;
  const figures =
    `At the stop the train's motion swings the dog force by v·√(k·m) = ${f(s.trainSpeed, "speed", 2)} × √(${f(s.chainStiffness, "stiffness", 0)} × ${f(s.trainMass, "mass", 0)}) = ${swing} ` +
    `about the load the dog carries, F = ${load}`;
  const rolled = s.ardCatches > 0;
  const sentences = [`At ${f(s.time, "time", 2)} ${how}, with the train moving at ${f(s.trainSpeed, "speed", 2)}.`];
  if (s.predictsRollback && rolled)
    sentences.push(`${figures}: ${inequality}, so the dog unloaded and the train rolled back ${f(s.rollback, "smallLength", 0)} onto the ARD.`);
  else if (s.predictsRollback)
    sentences.push(
      `${figures}: ${inequality}, so a sudden stop would unload the dog; this stop was gentler than a sudden one (the inequality is a bound)${s.dogUnloaded ? " and the dog unloaded only for a moment" : ""}, and the train did not roll back onto the ARD.`,
    );
  else
    sentences.push(
      `${figures}: ${inequality}, so the dog stayed loaded and the chain held the train${rolled ? `; the run still shows it back on the ARD (rollback ${f(s.rollback, "smallLength", 0)}), from the waves in the stopped chain` : ""}.`,
    );
  sentences.push(
    `Here k is the chain from the dog to the drive with the dog contact, m the train's mass and F its weight along the incline with rolling resistance and drag; the dog force swings with a period 2π·√(m/k) = ${f(s.swingPeriod, "time", 2)}.`,
  );
  if (rolled) sentences.push(`The ARD caught it${catchTime !== null ? ` at ${f(catchTime, "time", 2)}` : ""} with a peak force of ${f(s.peakArdForce, "force", 1)} (${s.ardCatches} catch${s.ardCatches === 1 ? "" : "es"}).`);
  if (s.restartTime === null) sentences.push("The drive did not restart during the run.");
  else if (s.restartToPickup !== null)
    sentences.push(`The drive restarted at ${f(s.restartTime, "time", 2)}; the dog carried the train again ${f(s.restartToPickup, "time", 2)} later, at ${f(pickupTime!, "time", 2)}.`);
  else sentences.push(`The drive restarted at ${f(s.restartTime, "time", 2)}, but the dog had not carried the train again by the end of the run.`);
  return { catchTime, pickupTime, predictsRollback: s.predictsRollback, inequality, sentences };
}
