/**
 * Design checks on a run's summary and the design statics against the scenario's limits.
 * Each check: pass / caution / fail with a one-line reason. Results support, and never replace,
 * review by a qualified engineer; local codes, the manufacturer's data and licensed practice govern.
 */
import { limitsSchema, type Limits } from "./schema";
import type { DesignStatics } from "./statics";
import type { Summary } from "./summary";

export type CheckState = "pass" | "caution" | "fail";

/** Kinds of quantity a reason quotes; each display layer maps them to its own units (SI or US customary). */
export type ReasonKind = "force" | "smallLength" | "length" | "power" | "rate";

/**
 * One piece of a reason: plain text, or an SI quantity (N, m, W, m/s) with the decimals its SI text uses.
 * Plain factors, counts, seconds and g stay in the text: they read the same in both unit systems.
 */
export type ReasonPart = { text: string } | { q: number; kind: ReasonKind; digits: number };

export interface Check {
  key: string;
  label: string;
  state: CheckState;
  value: number | boolean | null;
  limit: number | boolean | null;
  unit: string;
  /** One line in SI (kN, mm, m, kW, mm/s), for the command line and older readers. */
  reason: string;
  /** The same line as parts, so a screen or report can show the quantities in its reader's units. */
  parts: ReasonPart[];
}

/** Fraction of a limit above which a passing value is flagged as a caution. */
export const CAUTION_FRACTION = 0.8;

const fmt = (v: number, d = 2) => (Math.abs(v) >= 1000 ? v.toFixed(0) : v.toFixed(d));

const SI_TEXT: Record<ReasonKind, (si: number, d: number) => string> = {
  force: (v, d) => `${(v / 1000).toFixed(d)} kN`,
  smallLength: (v, d) => `${fmt(v * 1000, d)} mm`,
  length: (v, d) => `${fmt(v, d)} m`,
  power: (v, d) => `${fmt(v / 1000, d)} kW`,
  rate: (v, d) => `${fmt(v * 1000, d)} mm/s`,
};

/** A quantity part in SI, as the `reason` line prints it. */
export function siQuantityText(p: { q: number; kind: ReasonKind; digits: number }): string {
  return SI_TEXT[p.kind](p.q, p.digits);
}

/** The reason as one line, each quantity written by `quantity` (SI by default). */
export function reasonText(
  parts: readonly ReasonPart[],
  quantity: (p: { q: number; kind: ReasonKind; digits: number }) => string = siQuantityText,
): string {
  return parts.map((p) => ("text" in p ? p.text : quantity(p))).join("");
}

const kN = (v: number): ReasonPart => ({ q: v, kind: "force", digits: 1 });
const mm = (v: number, digits: number): ReasonPart => ({ q: v, kind: "smallLength", digits });
const m = (v: number, digits: number): ReasonPart => ({ q: v, kind: "length", digits });
const kW = (v: number): ReasonPart => ({ q: v, kind: "power", digits: 1 });
const mmPerS = (v: number, digits: number): ReasonPart => ({ q: v, kind: "rate", digits });

/** Builds `reason` and `parts` from text and quantity pieces. */
function because(...pieces: (string | ReasonPart)[]): { reason: string; parts: ReasonPart[] } {
  const parts = pieces.map((x) => (typeof x === "string" ? { text: x } : x));
  return { reason: reasonText(parts), parts };
}

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
      ...because("Peak tension ", kN(summary.peakTension), "; no steady climb in the run, so no snatch factor."),
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
      ...because("Peak ", kN(summary.peakTension), ` is ${fmt(snatch)}× the steady `, kN(summary.steadyTension ?? 0), ` (limit ${fmt(limits.maxSnatchFactor)}×).`),
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
    ...because(`Breaking strength over peak tension is ${fmt(sf)} (dynamic ${fmt(summary.minSafetyFactor)}, steady ${fmt(statics.safetyFactor)}); required ${fmt(req)}.`),
  });

  // Rollback and ARD catches.
  const spacing = statics.ardToothSpacing;
  const rb = summary.rollbackDistance;
  let rbState: CheckState = "pass";
  let rbReason = because("No rollback onto the ARD (largest backward travel ", mm(rb, 1), ").");
  if (rb - summary.peakArdCompression > spacing) {
    rbState = "fail";
    rbReason = because("The train rolled back ", m(rb, 3), ", more than one tooth spacing (", m(spacing, 3), "): the ARD did not hold.");
  } else if (summary.ardCatches > 0) {
    rbState = limits.allowRollback ? "caution" : "fail";
    rbReason = because(
      `The train settled back onto the ARD ${summary.ardCatches} time(s) (peak `,
      kN(summary.peakArdForce),
      ", ",
      mm(rb, 1),
      ` back)${limits.allowRollback ? "; allowed by the limits" : ""}.`,
    );
  }
  out.push({ key: "rollback", label: "Rollback and ARD catches", state: rbState, value: rb, limit: spacing, unit: "m", ...rbReason });

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
          ...because(
            summary.engagementTime === null
              ? "The dog never engaged a catch point."
              : "The dog engaged but never carried the train's full resisting load.",
          ),
        }
      : {
          key: "pickup",
          label: "Pick-up delay",
          state: pd > limits.maxPickupDelay ? "fail" : pd > CAUTION_FRACTION * limits.maxPickupDelay ? "caution" : "pass",
          value: pd,
          limit: limits.maxPickupDelay,
          unit: "s",
          ...because(`Full pick-up ${fmt(pd)} s after first dog contact (limit ${fmt(limits.maxPickupDelay)} s).`),
        },
  );

  // Take-up excursion against its room, end stops, and the travel budget of the statics.
  const tu = statics.takeUp;
  const dropUse = summary.takeUpMaxDrop / Math.max(1e-9, tu.roomBelow);
  const riseUse = summary.takeUpMaxRise / Math.max(1e-9, tu.roomAbove);
  const use = Math.max(dropUse, riseUse);
  let exState: CheckState = summary.takeUpEndStop ? "fail" : use > CAUTION_FRACTION ? "caution" : "pass";
  const exPieces: (string | ReasonPart)[] = summary.takeUpEndStop
    ? ["The take-up hit an end stop during the run."]
    : ["Run excursion ", mm(summary.takeUpMaxDrop, 0), " down / ", mm(summary.takeUpMaxRise, 0), ` up uses ${fmt(use * 100, 0)} % of the room.`];
  if (exState === "pass" && tu.required > tu.travel) {
    exState = tu.elasticExcursion + tu.thermal > tu.travel ? "fail" : "caution";
    exPieces.push(
      " Travel budget ",
      m(tu.required, 2),
      ` (elastic + ${fmt(limits.wearAllowance, 1)} % wear + thermal) exceeds the `,
      m(tu.travel, 2),
      " travel: shorten the chain as it wears.",
    );
  }
  out.push({ key: "takeUpTravel", label: "Take-up excursion and travel", state: exState, value: use, limit: 1, unit: "fraction of room", ...because(...exPieces) });

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
      ...because("No steady climb in the run, so no creep rate."),
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
      ...because(`The weight ${creep < 0 ? "rises" : "drops"} `, mmPerS(Math.abs(creep), 2), " over the climb (", mm(over, 0), ` in ${fmt(summary.steadyClimbDuration, 1)} s).`),
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
          ...because("Peak ", kW(peakP), ", steady ", kW(statics.motorPower), "; no motor rating given to compare."),
        }
      : {
          key: "drivePower",
          label: "Drive power",
          state: statics.motorPower > rating ? "fail" : peakP > rating ? "caution" : "pass",
          value: peakP,
          limit: rating,
          unit: "W",
          ...because("Steady ", kW(statics.motorPower), " and peak ", kW(peakP), " against a ", kW(rating), " motor."),
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
    ...because(`Peak ${fmt(ra)} g along the track (limit ${fmt(limits.maxRiderAccel)} g, an editable assumption; ASTM F2291 governs).`),
  });
  return out;
}
