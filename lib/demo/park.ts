/**
 * The demo park's design data: two lifts (with revisions), two trains and the scenarios that show the
 * phenomena Tautline is for. Everything is invented: no real park, ride, manufacturer or person.
 * Values are SI and use the engine's field names (sim/schema.ts), so the seed stores them as they are
 * and public/scenarios/*.json are made from the same rows.
 */
import { DEMO_ORGANISATIONS } from "@/lib/auth/demo-accounts";
import type {
  AntiRollbackSettings,
  ChainSettings,
  DriveSettings,
  LiftSettings,
  Limits,
  RunSettings,
  TakeUpSettings,
} from "@/sim/schema";
import type { Loading } from "@/models/Scenario";
import type { Dynamics } from "@/lib/scenarios/dynamics";
import type { TrainLike } from "@/lib/scenarios/engine";
import { EMBERLINE_CHAIN as emberlineChain, type In } from "./parts";
import { THORNWICK_LIFT, THORNWICK_SCENARIO } from "./thornwick";
import { OPERATIONS_DEMO_SCENARIOS } from "./operations-scenarios";

export const DEMO_PARK = DEMO_ORGANISATIONS.park;


export interface DemoRevision {
  changeSummary: string;
  geometry: In<LiftSettings>;
  chain: In<ChainSettings>;
  drive: In<DriveSettings>;
  takeUp: In<TakeUpSettings>;
  antiRollback: In<AntiRollbackSettings>;
  limits?: In<Limits>;
}

export interface DemoLift {
  key: string;
  name: string;
  site: string;
  notes: string;
  /** Revision 1, 2, … in order; the last is the lift's current revision. */
  revisions: DemoRevision[];
}

/** A demo train: the engine's train fields (TrainLike) with its key, name and notes. */
export interface DemoTrain extends TrainLike {
  key: string;
  name: string;
  notes: string;
  /** m behind the front; absent = one pawl at the dog. */
  pawls?: number[];
}

/**
 * A figure the scenario exists to show, checked by the tests against a real engine run. `field` names a
 * summary figure or a derived one (lib/demo/figures.ts); the limit is a number, or another demo
 * scenario's value of the same figure times `factor`.
 */
export interface DemoExpectation {
  field: string;
  op: ">=" | "<=" | ">" | "<" | "==";
  value?: number | boolean;
  than?: { scenario: string; factor: number };
  why: string;
}

export interface DemoScenario {
  /** File name in public/scenarios/ (without .json) and the seed's stable key. */
  key: string;
  name: string;
  lift: string;
  /** Revision number of that lift (1-based). */
  revision: number;
  train: string;
  loading: Loading;
  riderCount?: number;
  entrySpeed: number;
  startPosition: number;
  /** s, when the train appears (default 0). */
  startTime?: number;
  /** The scenario's own drive model and damping over the revision (lib/scenarios/dynamics.ts). */
  dynamics?: Dynamics;
  /** Trains after the lead train on the lift (scenario followers), each a demo train by key. */
  followers?: { train: string; loading: Loading; riderCount?: number; entrySpeed: number; startPosition: number; startTime: number }[];
  runSettings: In<RunSettings>;
  notes: string;
  /** One line for the README: what to look at in this run. */
  shows: string;
  expect: DemoExpectation[];
}

// Shared pieces ---------------------------------------------------------------------------------------

const emberlineGeometry: In<LiftSettings> = {
  approachLength: 15,
  sagRadius: 30,
  angle: 40,
  inclineLength: 50,
  crestRadius: 25,
  exitLength: 40,
  chainFrom: 10,
  chainTo: 122,
  dogRelease: 120,
  bottomRun: 4,
};

/*
 * Drive, guide and take-up values of the demo lifts (invented park; each value's basis in the comment):
 * - Motors: four-pole induction motors, rated slip 1.5–2 % and breakdown torque 2.3–2.5 × rated (typical
 *   of general-purpose motors of the size: induction-machine texts such as Chapman; NEMA MG 1 Design B
 *   minimums; both from memory). Rated power about 1.3 × the steady climbing power at the chain ÷ efficiency
 *   (common practice, no source).
 * - Drive inertia at the chain, J·(i/r)²: sprocket pitch radius r = pitch ÷ (2·sin(180°/teeth)), gear ratio
 *   i = motor speed ÷ sprocket speed; J of rotor + brake disc + coupling is an assumption for the motor size.
 * - Chain guides: Emberline's chain slides in a trough lined with UHMW-PE wear strips, μ ≈ 0.12 (sliding,
 *   0.1–0.2 for steel on PE: common practice, no source); Foxglove's chain rollers roll on a steel track,
 *   μ ≈ 0.03 (rolling: a few hundredths, common practice, no source).
 * - Take-up: counterweight carriage on guide rollers; friction ≈ 2 % of the counterweight's weight
 *   (assumption); no dashpot fitted.
 */

/**
 * 250 kW four-pole motor (≈1480 rpm) through an 11.2:1 gearbox to an 11-tooth sprocket of pitch radius
 * 0.1803 m (132 rpm at 2.5 m/s): (i/r)² = (11.2 / 0.1803)² ≈ 3860 m⁻²; J ≈ 4.0 kg·m² (rotor 3.4 + brake
 * disc and coupling 0.6: assumption) → ≈ 15.4 t at the chain. The full train's steady climb takes ≈ 215 kW
 * at the motor (the demo run's figure), so the motor runs at about 85 % of its rating.
 */
const emberlineMotor = { kind: "induction" as const, ratedPower: 250_000, ratedSlip: 0.015, breakdownRatio: 2.3, reflectedMass: 15_400 };
const emberlineDrive: In<DriveSettings> = { speed: 2.5, rampTime: 2, sprocketTeeth: 11, efficiency: 0.9, location: "bottom", motor: emberlineMotor };
/**
 * The capacity trial's climb takes ≈ 365 kW at 4.2 m/s: a 400 kW four-pole motor (rated slip 1.2 %, breakdown
 * 2.3, typical of the size; from memory) through 6.7:1 (sprocket 222 rpm): (6.7 / 0.1803)² ≈ 1380 m⁻²;
 * J ≈ 7 kg·m² (assumption) → ≈ 9.7 t at the chain. The 250 kW motor would stall at this speed.
 */
const emberlineTrialMotor = { kind: "induction" as const, ratedPower: 400_000, ratedSlip: 0.012, breakdownRatio: 2.3, reflectedMass: 9_700 };
/** 5000 kg counterweight: friction 2 % of 49 kN ≈ 1000 N. */
const emberlineTakeUp: In<TakeUpSettings> = { mass: 5000, travel: 2.5, position: 1.2, friction: 1000, damping: 0 };
const emberlineArd: In<AntiRollbackSettings> = { enabled: true, from: 12, to: 118, toothSpacing: 0.15 };

const foxgloveGeometry: In<LiftSettings> = {
  approachLength: 15,
  sagRadius: 25,
  angle: 35,
  inclineLength: 28,
  crestRadius: 20,
  exitLength: 30,
  chainFrom: 10,
  chainTo: 80,
  dogRelease: 78,
  bottomRun: 4,
};

/** Foxglove: 2.5 in pitch (No. 200 size: minimum 78,125 lbf = 348 kN), 400 kN lift chain (invented); E·A = 30 × 400 kN. */
const foxgloveChain: In<ChainSettings> = {
  massPerLength: 12,
  axialStiffness: 1.2e7,
  breakingStrength: 4.0e5,
  pitch: 0.0635,
  catchSpacing: 2,
  catchOffset: 10,
  guideFriction: 0.03,
};

/**
 * 55 kW four-pole motor (≈1470 rpm) through an 8.6:1 gearbox to a 12-tooth sprocket of pitch radius 0.1227 m
 * (171 rpm at 2.2 m/s): (i/r)² = (8.6 / 0.1227)² ≈ 4910 m⁻²; J ≈ 0.49 kg·m² (assumption) → ≈ 2.4 t at the chain.
 * Steady climb of the full train ≈ 20 kN × 2.2 m/s ÷ 0.9 ≈ 49 kW.
 */
const foxgloveMotor = { kind: "induction" as const, ratedPower: 55_000, ratedSlip: 0.02, breakdownRatio: 2.5, reflectedMass: 2_400 };
const foxgloveDrive: In<DriveSettings> = { speed: 2.2, rampTime: 2, sprocketTeeth: 12, efficiency: 0.9, location: "bottom", motor: foxgloveMotor };
/** 4000 kg counterweight: friction 2 % of 39 kN ≈ 800 N. */
const foxgloveTakeUp: In<TakeUpSettings> = { mass: 4000, travel: 2, position: 1.0, friction: 800, damping: 0 };
const foxgloveArd: In<AntiRollbackSettings> = { enabled: true, from: 12, to: 76, toothSpacing: 0.15 };

// Lifts -----------------------------------------------------------------------------------------------

export const DEMO_LIFTS: DemoLift[] = [
  {
    key: "emberline",
    name: "Emberline lift hill",
    site: "North valley, Lanternfell Park",
    notes: "Family-thrill coaster, 40° lift with a 2:1 gravity take-up under the station.",
    revisions: [
      {
        changeSummary: "As built",
        geometry: emberlineGeometry,
        chain: emberlineChain,
        drive: emberlineDrive,
        takeUp: emberlineTakeUp,
        antiRollback: emberlineArd,
      },
      {
        changeSummary: "Capacity trial: chain speed raised to 4.2 m/s with a short ramp; 400 kW motor through a 6.7:1 gearbox",
        geometry: emberlineGeometry,
        chain: emberlineChain,
        drive: { ...emberlineDrive, speed: 4.2, rampTime: 0.2, motor: emberlineTrialMotor },
        takeUp: emberlineTakeUp,
        antiRollback: emberlineArd,
      },
      {
        changeSummary: "Chain stretched in service: take-up counterweight now sits low in its travel",
        geometry: emberlineGeometry,
        chain: emberlineChain,
        drive: emberlineDrive,
        takeUp: { ...emberlineTakeUp, position: 2.21 },
        antiRollback: emberlineArd,
      },
      {
        changeSummary: "Chain refitted with catch blocks every 6 m; take-up reset to mid-travel",
        geometry: emberlineGeometry,
        chain: { ...emberlineChain, catchSpacing: 6 },
        drive: emberlineDrive,
        takeUp: emberlineTakeUp,
        antiRollback: emberlineArd,
      },
    ],
  },
  {
    key: "foxglove",
    name: "Foxglove lift hill",
    site: "Meadow garden, Lanternfell Park",
    notes: "Junior coaster, short 30° lift.",
    revisions: [
      {
        changeSummary: "As built",
        geometry: foxgloveGeometry,
        chain: foxgloveChain,
        drive: foxgloveDrive,
        takeUp: foxgloveTakeUp,
        antiRollback: foxgloveArd,
      },
      {
        changeSummary: "Chain worn (2.6 % elongation at the spring inspection): stiffness lowered to the measured value",
        geometry: foxgloveGeometry,
        chain: { ...foxgloveChain, axialStiffness: 1.5e6 },
        drive: foxgloveDrive,
        takeUp: foxgloveTakeUp,
        antiRollback: foxgloveArd,
      },
    ],
  },
  // A lift given as a profile (lib/demo/thornwick.ts).
  THORNWICK_LIFT,
];

// Trains ----------------------------------------------------------------------------------------------

export const DEMO_TRAINS: DemoTrain[] = [
  {
    key: "emberline-train",
    name: "Emberline six-car train",
    notes: "Six cars of four seats.",
    cars: 6,
    carMassEmpty: 1000,
    seatsPerCar: 4,
    riderMass: 75,
    carLength: 2.6,
    dogOffset: 1.3,
    rollingResistance: 0.015,
    dragArea: 1.0,
    // A pawl under the first and the last car (invented; the format's default is one pawl at the dog).
    pawls: [1.3, 14.3],
  },
  {
    key: "foxglove-train",
    name: "Foxglove four-car train",
    notes: "Four cars of two benches (four seats).",
    cars: 4,
    carMassEmpty: 450,
    seatsPerCar: 4,
    riderMass: 75,
    carLength: 2.0,
    dogOffset: 1.0,
    rollingResistance: 0.015,
    dragArea: 0.7,
  },
];

// Scenarios -------------------------------------------------------------------------------------------

export const DEMO_SCENARIOS: DemoScenario[] = [
  {
    key: "emberline-clean-pickup",
    name: "Emberline: clean pick-up",
    lift: "emberline",
    revision: 1,
    train: "emberline-train",
    loading: "full",
    entrySpeed: 2.2,
    startPosition: 14,
    runSettings: { duration: 40, segments: 60 },
    notes: "The train rolls in just below chain speed; the catch point behind its dog closes gently and lifts it away.",
    shows: "a clean pick-up: the dog engages at about 1 m/s, no rollback, no ARD catch, snatch factor well under 2",
    expect: [
      { field: "ardCatches", op: "==", value: 0, why: "no settling back onto the ARD" },
      { field: "rollbackDistance", op: "<", value: 0.01, why: "the train never rolls back" },
      { field: "snatchFactor", op: "<", value: 2, why: "below the default snatch limit of 2" },
      // Clean: with the induction drive, take-up friction and the chain's loss factor the snatch stays modest.
      { field: "snatchFactor", op: "<", value: 1.2, why: "a modest snatch: the peak within 20 % of the steady climb's tension" },
      { field: "minSafetyFactor", op: ">=", value: 5, why: "meets the default required safety factor of 5" },
      // Realistic total damping of the train-on-chain surge is roughly 1–5 % (engine README); the run must measure it.
      { field: "surgeDampingRatio", op: ">=", value: 0.01, why: "the surge after pick-up decays, damping ratio at least 1 %" },
      { field: "surgeDampingRatio", op: "<=", value: 0.1, why: "and no more than 10 %: a lightly damped mode, as on a real lift" },
    ],
  },
  {
    key: "emberline-too-fast-ard",
    name: "Emberline: too fast at the pick-up, settles back onto the ARD",
    lift: "emberline",
    revision: 4,
    train: "emberline-train",
    loading: "full",
    entrySpeed: 4.5,
    startPosition: 14,
    runSettings: { duration: 40, segments: 60 },
    notes:
      "Arriving at 4.5 m/s on a 2.5 m/s chain with catch blocks 6 m apart, the train runs ahead of the chain, slows on the incline and drops back onto the anti-rollback device before the next catch block picks it up.",
    shows: "a train that arrives too fast: it outruns the chain, settles back onto the ARD, then is picked up",
    expect: [{ field: "ardCatches", op: ">=", value: 1, why: "the train settles back onto the ARD at least once" }],
  },
  {
    key: "foxglove-worn-chain",
    name: "Foxglove: worn chain, long pick-up",
    lift: "foxglove",
    revision: 2,
    train: "foxglove-train",
    loading: "full",
    entrySpeed: 1.9,
    startPosition: 14,
    runSettings: { duration: 40, segments: 60 },
    notes:
      "The worn chain is eight times softer than the new one: the strand below the dog has to stretch before it carries the train, so the train takes longer to come up to chain speed and the take-up drops far more.",
    shows: "a soft (worn) chain: a slower pick-up than the same train on the new chain, and a large take-up drop",
    expect: [
      { field: "comeUpTime", op: ">", than: { scenario: "foxglove-full-train", factor: 1.5 }, why: "the pick-up takes clearly longer than on the new chain" },
      { field: "takeUpMaxDrop", op: ">", than: { scenario: "foxglove-full-train", factor: 3 }, why: "the soft chain stretches far more" },
    ],
  },
  {
    key: "emberline-takeup-near-stop",
    name: "Emberline: take-up close to its end stop",
    lift: "emberline",
    revision: 3,
    train: "emberline-train",
    loading: "full",
    entrySpeed: 2.2,
    startPosition: 14,
    runSettings: { duration: 40, segments: 60 },
    notes:
      "With the counterweight already low after chain stretch, the extra stretch of a loaded lift brings the take-up within a few centimetres of its bottom stop.",
    shows: "a take-up that nearly reaches its end stop: look at the take-up margin",
    expect: [
      { field: "takeUpMargin", op: "<", value: 0.1, why: "less than 10 cm of take-up travel left" },
      { field: "takeUpEndStop", op: "==", value: false, why: "it does not actually hit the stop" },
    ],
  },
  {
    key: "foxglove-empty-train",
    name: "Foxglove: empty train",
    lift: "foxglove",
    revision: 1,
    train: "foxglove-train",
    loading: "empty",
    entrySpeed: 1.9,
    startPosition: 14,
    runSettings: { duration: 40, segments: 60 },
    notes: "Compare with the full train: lower chain tension, less take-up travel, less motor power.",
    shows: "an empty train: compare its tension, take-up drop and drive power with the full train",
    expect: [
      // The peak at the pick-up is close to the full train's (the lighter train snatches more); the climb is not.
      { field: "steadyTension", op: "<", than: { scenario: "foxglove-full-train", factor: 0.9 }, why: "clearly less tension in the steady climb than the full train" },
    ],
  },
  {
    key: "foxglove-full-train",
    name: "Foxglove: full train",
    lift: "foxglove",
    revision: 1,
    train: "foxglove-train",
    loading: "full",
    entrySpeed: 1.9,
    startPosition: 14,
    runSettings: { duration: 40, segments: 60 },
    notes: "Sixteen riders of 75 kg: higher peak tension, more take-up travel and more drive power than the empty train.",
    shows: "a full train: compare with the empty one",
    expect: [
      { field: "takeUpMaxDrop", op: ">", than: { scenario: "foxglove-empty-train", factor: 1.2 }, why: "the heavier train stretches the chain more" },
      { field: "steadyDrivePower", op: ">", than: { scenario: "foxglove-empty-train", factor: 1.1 }, why: "more power to lift the riders" },
    ],
  },
  {
    key: "emberline-fast-chain-snatch",
    name: "Emberline: fast chain, high snatch factor",
    lift: "emberline",
    revision: 2,
    train: "emberline-train",
    loading: "full",
    entrySpeed: 1.0,
    startPosition: 14,
    runSettings: { duration: 30, segments: 60 },
    notes: "The train creeps in at 1 m/s and a catch point moving at 4.2 m/s hits its dog: a large snatch load on the chain.",
    shows: "a fast chain picking up a slow train: a snatch load far above the clean pick-up's, safety factor below the required 5",
    expect: [
      { field: "peakTension", op: ">", than: { scenario: "emberline-clean-pickup", factor: 1.5 }, why: "the snatch load is far above the clean pick-up's peak" },
      { field: "minSafetyFactor", op: "<", value: 5, why: "the snatch load takes the chain below the required safety factor of 5" },
    ],
  },
  // A two-slope lift with a first drop, given as a profile (lib/demo/thornwick.ts).
  THORNWICK_SCENARIO,
  // Lift operations: several trains, a stop and a restart (lib/demo/operations-scenarios.ts).
  ...OPERATIONS_DEMO_SCENARIOS,
];

export function demoLift(key: string): DemoLift {
  const l = DEMO_LIFTS.find((x) => x.key === key);
  if (!l) throw new Error(`No demo lift ${key}`);
  return l;
}

export function demoTrain(key: string): DemoTrain {
  const t = DEMO_TRAINS.find((x) => x.key === key);
  if (!t) throw new Error(`No demo train ${key}`);
  return t;
}
