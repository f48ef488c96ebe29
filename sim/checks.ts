/**
 * Design checks on a run's summary and the design statics against the scenario's limits.
 * Each check: pass / caution / fail with a one-line reason. Every limit is editable (`limits`) and names its
 * source or says "assumption" (LIMIT_SOURCES). Results support, and never replace, review by a qualified
 * engineer; local codes, the manufacturer's data and licensed practice govern.
 */
import { limitsSchema, type Limits } from "./schema";
import type { DesignStatics } from "./statics";
import { RIDER_ACCEL_LEVEL_STEP, type RiderAccelExposure, type Summary } from "./summary";

export type CheckState = "pass" | "caution" | "fail";

/** Kinds of quantity a reason quotes; each display layer maps them to its own units (SI or US customary). */
export type ReasonKind = "force" | "smallLength" | "length" | "power" | "rate" | "speed" | "energy";

/**
 * One piece of a reason: plain text, or an SI quantity (N, m, W, m/s, J) with the decimals its SI text uses.
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
  speed: (v, d) => `${v.toFixed(d)} m/s`,
  energy: (v, d) => `${(v / 1000).toFixed(d)} kJ`,
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
const mPerS = (v: number, digits: number): ReasonPart => ({ q: v, kind: "speed", digits });
const kJ = (v: number): ReasonPart => ({ q: v, kind: "energy", digits: 1 });

/** Builds `reason` and `parts` from text and quantity pieces. */
function because(...pieces: (string | ReasonPart)[]): { reason: string; parts: ReasonPart[] } {
  const parts = pieces.map((x) => (typeof x === "string" ? { text: x } : x));
  return { reason: reasonText(parts), parts };
}

/** ASME B29.1 minimum ultimate tensile strength of standard roller chain, per strand: 12,500·P² lbf, P in inches. */
export function b29MinimumStrength(pitch: number): number {
  const inches = pitch / 0.0254; // 1 in = 0.0254 m (exact)
  return 12_500 * inches * inches * 4.4482216152605; // 1 lbf = 4.4482216152605 N (exact)
}

/**
 * Longest continuous time the filtered acceleration stayed above `level` (g), read conservatively from the
 * exposure grid: the time above the grid level at or below `level`. Below the first grid level: the run.
 */
export function timeAbove(exposure: readonly number[], level: number, runTime: number): number {
  const k = Math.floor(level / RIDER_ACCEL_LEVEL_STEP + 1e-9) - 1;
  if (k < 0) return runTime;
  return exposure[Math.min(k, exposure.length - 1)] ?? 0;
}

function state(value: number, limit: number): CheckState {
  return value > limit ? "fail" : value > CAUTION_FRACTION * limit ? "caution" : "pass";
}

export function evaluateChecks(summary: Summary, statics: DesignStatics, limitsIn: Partial<Limits> = {}): Check[] {
  const limits = limitsSchema.parse(limitsIn);
  return [
    snatchCheck(summary, limits),
    safetyFactorCheck(summary, statics, limits),
    workingLoadCheck(summary, statics, limits),
    breakingStrengthCheck(statics, limits),
    rollbackCheck(summary, statics, limits),
    pickupCheck(summary, limits),
    takeUpTravelCheck(summary, statics),
    takeUpWearCheck(statics, limits),
    takeUpCreepCheck(summary, statics),
    drivePowerCheck(summary, statics, limits),
    riderAccelCheck(summary, limits),
    releaseCheck(summary, limits),
  ];
}

/** At the dog's release the train's kinetic energy must clear the crest with the margin set; a re-engagement fails. */
function releaseCheck(summary: Summary, limits: Limits): Check {
  const limit = limits.releaseEnergyMargin;
  const base = { key: "release", label: "Release: energy to clear the crest", limit, unit: "" };
  const r = summary.release ?? null;
  if (!r) return { ...base, state: "pass", value: null, ...because("The dog was not released during the run.") };
  const head = [
    `At the release (t = ${r.time.toFixed(2)} s) the train moves at `,
    mPerS(r.speed, 2),
    ": kinetic energy ",
    kJ(r.kineticEnergy),
    " against ",
    kJ(r.energyNeeded),
    " to rise ",
    m(r.rise, 2),
    " to the crest with rolling resistance",
  ];
  const again = r.reengagedAt !== null ? `; it fell back and the dog re-engaged at t = ${r.reengagedAt.toFixed(2)} s` : "";
  if (r.margin === null)
    return { ...base, state: r.reengagedAt !== null ? "fail" : "pass", value: null, ...because(...head, ` (nothing left to climb)${again}.`) };
  const st: CheckState = r.margin < limit || r.reengagedAt !== null ? "fail" : r.margin < limit / CAUTION_FRACTION ? "caution" : "pass";
  return { ...base, state: st, value: r.margin, ...because(...head, `: margin ${r.margin.toFixed(2)} (required ${limit.toFixed(2)})${again}.`) };
}

/** Peak drive tension over steady drive tension (both at the drive); the peak anywhere is quoted beside it. */
function snatchCheck(summary: Summary, limits: Limits): Check {
  const base = { key: "snatch", label: "Peak tension and snatch factor", limit: limits.maxSnatchFactor, unit: "" };
  const snatch = summary.snatchFactor;
  if (snatch === null)
    return {
      ...base,
      state: "caution",
      value: null,
      ...because("Peak tension ", kN(summary.peakTension), "; no steady climb in the run, so no snatch factor."),
    };
  const st: CheckState =
    snatch > limits.maxSnatchFactor ? "fail" : snatch > 1 + CAUTION_FRACTION * (limits.maxSnatchFactor - 1) ? "caution" : "pass";
  return {
    ...base,
    state: st,
    value: snatch,
    ...because(
      "Peak drive tension ",
      kN(summary.peakDriveTension),
      ` is ${fmt(snatch)}× the steady `,
      kN(summary.steadyTension ?? 0),
      ` (limit ${fmt(limits.maxSnatchFactor)}×); peak anywhere `,
      kN(summary.peakTension),
      ".",
    ),
  };
}

/** The worse of the dynamic peak and the statics against the required safety factor. */
function safetyFactorCheck(summary: Summary, statics: DesignStatics, limits: Limits): Check {
  const sf = Math.min(summary.minSafetyFactor, statics.safetyFactor);
  const req = limits.requiredSafetyFactor;
  return {
    key: "safetyFactor",
    label: "Chain safety factor",
    state: sf < req ? "fail" : sf < req / CAUTION_FRACTION ? "caution" : "pass",
    value: sf,
    limit: req,
    unit: "",
    ...because(`Breaking strength over peak tension is ${fmt(sf)} (dynamic ${fmt(summary.minSafetyFactor)}, steady ${fmt(statics.safetyFactor)}); required ${fmt(req)}.`),
  };
}

/**
 * Working load (fatigue): steady tension above the allowable working load fails; the dynamic peak above it is
 * a caution (check the maker's fatigue data for that many cycles).
 */
function workingLoadCheck(summary: Summary, statics: DesignStatics, limits: Limits): Check {
  const fromMaker = limits.allowableWorkingLoad !== undefined;
  const wl = limits.allowableWorkingLoad ?? limits.workingLoadFraction * statics.breakingStrength;
  const steady = statics.worst.maxTension;
  const peak = summary.peakTension;
  const st: CheckState = steady > wl ? "fail" : peak > wl || steady > CAUTION_FRACTION * wl ? "caution" : "pass";
  const inverse = 1 / limits.workingLoadFraction;
  const share = Math.abs(inverse - Math.round(inverse)) < 1e-6 ? `1/${Math.round(inverse)}` : `${fmt(limits.workingLoadFraction * 100, 1)} %`;
  const source = fromMaker ? "the maker's allowable working load" : `the working load taken as ${share} of breaking strength (an assumption; enter the maker's)`;
  const tail = st === "pass" ? "." : steady > wl ? ": the steady tension is above it." : peak > wl ? ": the peak is above it, check the maker's fatigue data." : ": the steady tension is close to it.";
  return {
    key: "workingLoad",
    label: "Chain working load (fatigue)",
    state: st,
    value: peak / wl,
    limit: 1,
    unit: "fraction of working load",
    ...because("Steady ", kN(steady), " and peak ", kN(peak), " against ", kN(wl), `, ${source}${tail}`),
  };
}

/** Breaking strength against ASME B29.1's minimum for standard roller chain of the pitch: a caution only. */
function breakingStrengthCheck(statics: DesignStatics, limits: Limits): Check {
  const b29 = b29MinimumStrength(statics.pitch);
  const ratio = statics.breakingStrength / b29;
  const low = ratio < limits.minBreakingRatio;
  const high = ratio > limits.maxBreakingRatio;
  return {
    key: "breakingStrength",
    label: "Breaking strength against the pitch (ASME B29.1)",
    state: low || high ? "caution" : "pass",
    value: ratio,
    limit: low ? limits.minBreakingRatio : limits.maxBreakingRatio,
    unit: "× 12,500·P² lbf",
    ...because(
      "Breaking strength ",
      kN(statics.breakingStrength),
      ` is ${fmt(ratio)}× ASME B29.1's minimum for standard roller chain of this pitch, 12,500·P² lbf = `,
      kN(b29),
      low
        ? ": weaker than standard roller chain; check the input or the maker's data (non-standard chain)."
        : high
          ? ": far above one strand of standard chain; check the input or the chain type."
          : ".",
    ),
  };
}

function rollbackCheck(summary: Summary, statics: DesignStatics, limits: Limits): Check {
  const spacing = statics.ardToothSpacing;
  const rb = summary.rollbackDistance;
  const bounces = summary.ardBounces ?? 0;
  const bounceText = bounces > 0 ? `, ${bounces} bounce(s) counted apart` : "";
  let rbState: CheckState = "pass";
  let rbReason = because("No rollback onto the ARD (largest backward travel ", mm(rb, 1), `${bounceText}).`);
  if (rb - summary.peakArdCompression > spacing) {
    rbState = "fail";
    rbReason = because("The train rolled back ", m(rb, 3), ", more than one tooth spacing (", m(spacing, 3), "): the ARD did not hold.");
  } else if (summary.ardCatches > 0) {
    rbState = limits.allowRollback ? "caution" : "fail";
    rbReason = because(
      `The train settled back onto the ARD ${summary.ardCatches} time(s)${bounceText} (peak `,
      kN(summary.peakArdForce),
      ", ",
      mm(rb, 1),
      ` back)${limits.allowRollback ? "; allowed by the limits" : ""}.`,
    );
  }
  return { key: "rollback", label: "Rollback and ARD catches", state: rbState, value: rb, limit: spacing, unit: "m", ...rbReason };
}

/** Load pick-up delay (v1 definition) and time to chain speed, each against its limit. */
function pickupCheck(summary: Summary, limits: Limits): Check {
  const base = { key: "pickup", label: "Pick-up: load delay and time to chain speed", limit: limits.maxPickupDelay, unit: "s" };
  const pd = summary.pickupDelay;
  const tcs = summary.timeToChainSpeed ?? null;
  if (summary.engagementTime === null)
    return { ...base, state: "fail", value: null, ...because("The dog never engaged a catch point.") };
  if (pd === null)
    return { ...base, state: "caution", value: null, ...because("The dog engaged but never carried the train's full resisting load.") };
  const pdState = state(pd, limits.maxPickupDelay);
  const tcsState: CheckState = tcs === null ? "caution" : state(tcs, limits.maxTimeToChainSpeed);
  const order: CheckState[] = ["pass", "caution", "fail"];
  const worst = order[Math.max(order.indexOf(pdState), order.indexOf(tcsState))];
  const tcsText =
    tcs === null
      ? "the train never ran within 5 % of chain speed"
      : `at chain speed (within 5 %) ${fmt(tcs)} s after it (limit ${fmt(limits.maxTimeToChainSpeed)} s)`;
  return {
    ...base,
    state: worst,
    value: pd,
    ...because(`The dog carries the load ${fmt(pd)} s after first contact (limit ${fmt(limits.maxPickupDelay)} s); ${tcsText}.`),
  };
}

/** Run excursion against the room, end stops, and the running travel budget (elastic + thermal; wear apart). */
function takeUpTravelCheck(summary: Summary, statics: DesignStatics): Check {
  const tu = statics.takeUp;
  const dropUse = summary.takeUpMaxDrop / Math.max(1e-9, tu.roomBelow);
  const riseUse = summary.takeUpMaxRise / Math.max(1e-9, tu.roomAbove);
  const use = Math.max(dropUse, riseUse);
  let exState: CheckState = summary.takeUpEndStop ? "fail" : use > CAUTION_FRACTION ? "caution" : "pass";
  const exPieces: (string | ReasonPart)[] = summary.takeUpEndStop
    ? ["The take-up hit an end stop during the run."]
    : ["Run excursion ", mm(summary.takeUpMaxDrop, 0), " down / ", mm(summary.takeUpMaxRise, 0), ` up uses ${fmt(use * 100, 0)} % of the room.`];
  const running = tu.runningRequired ?? tu.elasticExcursion + tu.thermal;
  if (running > tu.travel) {
    exState = "fail";
    exPieces.push(" Elastic drop ", m(tu.elasticExcursion, 2), " + thermal ", m(tu.thermal, 2), " exceeds the ", m(tu.travel, 2), " travel.");
  } else if (exState === "pass" && running > CAUTION_FRACTION * tu.travel) {
    exState = "caution";
    exPieces.push(" Elastic drop + thermal ", m(running, 2), " uses most of the ", m(tu.travel, 2), " travel.");
  }
  return { key: "takeUpTravel", label: "Take-up excursion and travel", state: exState, value: use, limit: 1, unit: "fraction of room", ...because(...exPieces) };
}

/** Wear the take-up can absorb (travel left after elastic + thermal) against the wear allowance, apart. */
function takeUpWearCheck(statics: DesignStatics, limits: Limits): Check {
  const tu = statics.takeUp;
  const capacity = Math.max(0, tu.wearCapacity ?? 0);
  const fits = capacity >= limits.wearAllowance;
  return {
    key: "takeUpWear",
    label: "Take-up room for chain wear",
    state: fits ? "pass" : "caution",
    value: capacity,
    limit: limits.wearAllowance,
    unit: "% elongation",
    ...because(
      `The travel left after the elastic drop and heat takes up ${fmt(capacity, 1)} % wear elongation of the loop`,
      fits
        ? ` (allowance ${fmt(limits.wearAllowance, 1)} %, `
        : `; the ${fmt(limits.wearAllowance, 1)} % allowance needs `,
      m(tu.wearAllowance, 2),
      fits ? " of travel)." : ` of travel: shorten the chain each time it has stretched about ${fmt(capacity, 1)} %.`,
    ),
  };
}

function takeUpCreepCheck(summary: Summary, statics: DesignStatics): Check {
  const tu = statics.takeUp;
  const creep = summary.takeUpCreepRate;
  if (creep === null)
    return {
      key: "takeUpCreep",
      label: "Take-up creep",
      state: "caution",
      value: null,
      limit: null,
      unit: "m/s",
      ...because("No steady climb of two surge periods in the run, so no creep rate."),
    };
  const over = Math.abs(creep) * summary.steadyClimbDuration;
  const room = creep < 0 ? tu.roomAbove : tu.roomBelow;
  const frac = over / Math.max(1e-9, room);
  return {
    key: "takeUpCreep",
    label: "Take-up creep",
    state: frac > 1 ? "fail" : frac > CAUTION_FRACTION ? "caution" : "pass",
    value: creep,
    limit: null,
    unit: "m/s",
    ...because(`The weight ${creep < 0 ? "rises" : "drops"} `, mmPerS(Math.abs(creep), 2), " over the climb (", mm(over, 0), ` in ${fmt(summary.steadyClimbDuration, 1)} s).`),
  };
}

function drivePowerCheck(summary: Summary, statics: DesignStatics, limits: Limits): Check {
  const peakP = summary.peakDrivePower;
  const rating = limits.motorRating;
  return rating === undefined
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
      };
}

/**
 * Rider acceleration against a duration-dependent envelope, forward and backward: the filtered longitudinal
 * acceleration may exceed each level for at most its time at once, and never the ceiling. The value is the
 * worst use of the envelope (time above a level over its allowed time, or peak over the ceiling).
 */
function riderAccelCheck(summary: Summary, limits: Limits): Check {
  const runTime = summary.simulatedTime;
  const exp: RiderAccelExposure | undefined = summary.riderAccelExposure;
  const points = [
    { level: limits.maxRiderAccel, duration: limits.riderAccelBriefDuration },
    { level: limits.riderAccelSustained, duration: limits.riderAccelSustainedDuration },
  ];
  let worst = { use: 0, text: "" };
  for (const dir of ["forward", "backward"] as const) {
    const scale = dir === "backward" ? limits.riderAccelBackwardScale : 1;
    const ceiling = limits.riderAccelCeiling * scale;
    const peak = exp ? (dir === "forward" ? exp.forwardPeak : exp.backwardPeak) ?? summary.peakRiderAccel : summary.peakRiderAccel;
    const pu = peak / ceiling;
    if (pu > worst.use) worst = { use: pu, text: `${dir} peak ${fmt(peak)} g against the ${fmt(ceiling)} g ceiling` };
    if (!exp) continue;
    for (const p of points) {
      const level = p.level * scale;
      const time = timeAbove(dir === "forward" ? exp.forward : exp.backward, level, runTime);
      const use = p.duration > 0 ? time / p.duration : time > 0 ? Infinity : 0;
      if (use > worst.use) worst = { use, text: `${dir} ${fmt(time)} s above ${fmt(level)} g (allowed ${fmt(p.duration)} s)` };
    }
  }
  const envelope = `envelope ${fmt(limits.maxRiderAccel)} g for ${fmt(limits.riderAccelBriefDuration)} s, ${fmt(limits.riderAccelSustained)} g for ${fmt(limits.riderAccelSustainedDuration)} s, ceiling ${fmt(limits.riderAccelCeiling)} g`;
  return {
    key: "riderAccel",
    label: "Rider acceleration (longitudinal, by duration)",
    state: worst.use > 1 ? "fail" : worst.use > CAUTION_FRACTION ? "caution" : "pass",
    value: Number.isFinite(worst.use) ? worst.use : null,
    limit: 1,
    unit: "fraction of envelope",
    ...because(
      `Peak ${fmt(summary.peakRiderAccel)} g; ${worst.use > 1 ? "outside the envelope" : "within the envelope"}, most used: ${worst.text || "none"} (${envelope}: editable limits; ASTM F2291 governs, enter your organisation's numbers).`,
    ),
  };
}
