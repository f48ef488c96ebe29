/**
 * Design checks on a run's summary and the design statics against the scenario's limits.
 * Each check: pass / caution / fail with a one-line reason. Results support, and never replace,
 * review by a qualified engineer; local codes, the manufacturer's data and licensed practice govern.
 */
import { limitsSchema, type Limits } from "./schema";
import type { DesignStatics } from "./statics";
import type { Summary } from "./summary";

export type CheckState = "pass" | "caution" | "fail";

export interface Check {
  key: string;
  label: string;
  state: CheckState;
  value: number | boolean | null;
  limit: number | boolean | null;
  unit: string;
  reason: string;
}

/** Fraction of a limit above which a passing value is flagged as a caution. */
export const CAUTION_FRACTION = 0.8;

const fmt = (v: number, d = 2) => (Math.abs(v) >= 1000 ? v.toFixed(0) : v.toFixed(d));
const kN = (v: number) => `${(v / 1000).toFixed(1)} kN`;

export function evaluateChecks(summary: Summary, statics: DesignStatics, limitsIn: Partial<Limits> = {}): Check[] {
  const limits = limitsSchema.parse(limitsIn);
  const out: Check[] = [];

  // Peak tension and snatch factor.
  const snatch = summary.snatchFactor;
  if (snatch === null) {
    out.push({
      key: "snatch",
      label: "Peak tension and snatch factor",
      state: "caution",
      value: null,
      limit: limits.maxSnatchFactor,
      unit: "",
      reason: `Peak tension ${kN(summary.peakTension)}; no steady climb in the run, so no snatch factor.`,
    });
  } else {
    const state: CheckState =
      snatch > limits.maxSnatchFactor ? "fail" : snatch > 1 + CAUTION_FRACTION * (limits.maxSnatchFactor - 1) ? "caution" : "pass";
    out.push({
      key: "snatch",
      label: "Peak tension and snatch factor",
      state,
      value: snatch,
      limit: limits.maxSnatchFactor,
      unit: "",
      reason: `Peak ${kN(summary.peakTension)} is ${fmt(snatch)}× the steady ${kN(summary.steadyTension ?? 0)} (limit ${fmt(limits.maxSnatchFactor)}×).`,
    });
  }

  // Safety factor: the worse of the dynamic peak and the statics.
  const sf = Math.min(summary.minSafetyFactor, statics.safetyFactor);
  const req = limits.requiredSafetyFactor;
  out.push({
    key: "safetyFactor",
    label: "Chain safety factor",
    state: sf < req ? "fail" : sf < req / CAUTION_FRACTION ? "caution" : "pass",
    value: sf,
    limit: req,
    unit: "",
    reason: `Breaking strength over peak tension is ${fmt(sf)} (dynamic ${fmt(summary.minSafetyFactor)}, steady ${fmt(statics.safetyFactor)}); required ${fmt(req)}.`,
  });

  // Rollback and ARD catches.
  const spacing = statics.ardToothSpacing;
  const rb = summary.rollbackDistance;
  let rbState: CheckState = "pass";
  let rbReason = `No rollback onto the ARD (largest backward travel ${fmt(rb * 1000, 1)} mm).`;
  if (rb - summary.peakArdCompression > spacing) {
    rbState = "fail";
    rbReason = `The train rolled back ${fmt(rb, 3)} m, more than one tooth spacing (${fmt(spacing, 3)} m): the ARD did not hold.`;
  } else if (summary.ardCatches > 0) {
    rbState = limits.allowRollback ? "caution" : "fail";
    rbReason = `The train settled back onto the ARD ${summary.ardCatches} time(s) (peak ${kN(summary.peakArdForce)}, ${fmt(rb * 1000, 1)} mm back)${limits.allowRollback ? "; allowed by the limits" : ""}.`;
  }
  out.push({ key: "rollback", label: "Rollback and ARD catches", state: rbState, value: rb, limit: spacing, unit: "m", reason: rbReason });

  // Pick-up delay.
  const pd = summary.pickupDelay;
  out.push(
    pd === null
      ? {
          key: "pickup",
          label: "Pick-up delay",
          state: summary.engagementTime === null ? "fail" : "caution",
          value: null,
          limit: limits.maxPickupDelay,
          unit: "s",
          reason:
            summary.engagementTime === null
              ? "The dog never engaged a catch point."
              : "The dog engaged but never carried the train's full resisting load.",
        }
      : {
          key: "pickup",
          label: "Pick-up delay",
          state: pd > limits.maxPickupDelay ? "fail" : pd > CAUTION_FRACTION * limits.maxPickupDelay ? "caution" : "pass",
          value: pd,
          limit: limits.maxPickupDelay,
          unit: "s",
          reason: `Full pick-up ${fmt(pd)} s after first dog contact (limit ${fmt(limits.maxPickupDelay)} s).`,
        },
  );

  // Take-up excursion against its room, end stops, and the travel budget of the statics.
  const tu = statics.takeUp;
  const dropUse = summary.takeUpMaxDrop / Math.max(1e-9, tu.roomBelow);
  const riseUse = summary.takeUpMaxRise / Math.max(1e-9, tu.roomAbove);
  const use = Math.max(dropUse, riseUse);
  let exState: CheckState = summary.takeUpEndStop ? "fail" : use > CAUTION_FRACTION ? "caution" : "pass";
  let exReason = summary.takeUpEndStop
    ? "The take-up hit an end stop during the run."
    : `Run excursion ${fmt(summary.takeUpMaxDrop * 1000, 0)} mm down / ${fmt(summary.takeUpMaxRise * 1000, 0)} mm up uses ${fmt(use * 100, 0)} % of the room.`;
  if (exState === "pass" && tu.required > tu.travel) {
    exState = tu.elasticExcursion + tu.thermal > tu.travel ? "fail" : "caution";
    exReason += ` Travel budget ${fmt(tu.required, 2)} m (elastic + ${fmt(limits.wearAllowance, 1)} % wear + thermal) exceeds the ${fmt(tu.travel, 2)} m travel: shorten the chain as it wears.`;
  }
  out.push({ key: "takeUpTravel", label: "Take-up excursion and travel", state: exState, value: use, limit: 1, unit: "fraction of room", reason: exReason });

  // Take-up creep over the steady climb.
  const creep = summary.takeUpCreepRate;
  if (creep === null) {
    out.push({
      key: "takeUpCreep",
      label: "Take-up creep",
      state: "caution",
      value: null,
      limit: null,
      unit: "m/s",
      reason: "No steady climb in the run, so no creep rate.",
    });
  } else {
    const over = Math.abs(creep) * summary.steadyClimbDuration;
    const room = creep < 0 ? tu.roomAbove : tu.roomBelow;
    const frac = over / Math.max(1e-9, room);
    out.push({
      key: "takeUpCreep",
      label: "Take-up creep",
      state: frac > 1 ? "fail" : frac > CAUTION_FRACTION ? "caution" : "pass",
      value: creep,
      limit: null,
      unit: "m/s",
      reason: `The weight ${creep < 0 ? "rises" : "drops"} ${fmt(Math.abs(creep) * 1000, 2)} mm/s over the climb (${fmt(over * 1000, 0)} mm in ${fmt(summary.steadyClimbDuration, 1)} s).`,
    });
  }

  // Drive power against the motor rating.
  const peakP = summary.peakDrivePower;
  const rating = limits.motorRating;
  out.push(
    rating === undefined
      ? {
          key: "drivePower",
          label: "Drive power",
          state: "caution",
          value: peakP,
          limit: null,
          unit: "W",
          reason: `Peak ${fmt(peakP / 1000, 1)} kW, steady ${fmt(statics.motorPower / 1000, 1)} kW; no motor rating given to compare.`,
        }
      : {
          key: "drivePower",
          label: "Drive power",
          state: statics.motorPower > rating ? "fail" : peakP > rating ? "caution" : "pass",
          value: peakP,
          limit: rating,
          unit: "W",
          reason: `Steady ${fmt(statics.motorPower / 1000, 1)} kW and peak ${fmt(peakP / 1000, 1)} kW against a ${fmt(rating / 1000, 1)} kW motor.`,
        },
  );

  // Rider acceleration.
  const ra = summary.peakRiderAccel;
  out.push({
    key: "riderAccel",
    label: "Rider acceleration (longitudinal)",
    state: ra > limits.maxRiderAccel ? "fail" : ra > CAUTION_FRACTION * limits.maxRiderAccel ? "caution" : "pass",
    value: ra,
    limit: limits.maxRiderAccel,
    unit: "g",
    reason: `Peak ${fmt(ra)} g along the track (limit ${fmt(limits.maxRiderAccel)} g, an editable assumption; ASTM F2291 governs).`,
  });
  return out;
}
