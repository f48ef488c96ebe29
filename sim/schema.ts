/**
 * The scenario format `tautline-scenario/2`: one zod schema shared by the engine, the API, the UI and the CLI.
 * SI units throughout (m, kg, s, N, W); angles in degrees (the only non-SI field, converted at the edge).
 * Every message names its field path, e.g. "lift.angle must be at most 80 (degrees)".
 * `tautline-scenario/1` files stay readable: `parseScenario` validates them with the version 1 schema and
 * converts them with `upgradeScenario` (an ideal drive, no loss factor, the contacts version 1 used).
 */
import { z } from "zod";
import { meshCounts } from "./loop";
import { wearDrop } from "./wear";
import { PARAMETRIC_FIELDS, parametricProfile, profileIssues, profileLength, type ProfilePiece } from "./profile";

export const SCENARIO_FORMAT = "tautline-scenario/2";
export const SCENARIO_FORMAT_V1 = "tautline-scenario/1";

interface NumOpts {
  min?: number; // inclusive lower bound
  gt?: number; // exclusive lower bound
  max?: number; // inclusive upper bound
  int?: boolean;
}

/** A finite number with bounds whose messages name the field and its unit. */
function num(path: string, unit: string, o: NumOpts) {
  const u = unit ? ` (${unit})` : "";
  let s = z.number({
    error: (iss) =>
      iss.input === undefined ? `${path} is required${u}` : `${path} must be a finite number${u}`,
  });
  if (o.int) s = s.int({ error: `${path} must be a whole number` });
  if (o.gt !== undefined) s = s.gt(o.gt, { error: `${path} must be greater than ${o.gt}${u}` });
  if (o.min !== undefined) s = s.min(o.min, { error: `${path} must be at least ${o.min}${u}` });
  if (o.max !== undefined) s = s.max(o.max, { error: `${path} must be at most ${o.max}${u}` });
  return s;
}

/** A missing or non-object section says which one. */
function section(path: string) {
  return { error: `${path} must be an object (section "${path}")` };
}

function bool(path: string) {
  return z.boolean({ error: `${path} must be true or false` });
}

/**
 * `lift.profile`: the track as pieces from the station (see sim/profile.ts). Each piece's numbers and each join
 * are checked by profileIssues, whose messages name the piece's path and unit.
 */
export const profileSchema = z
  .array(z.unknown(), { error: 'lift.profile must be a list of pieces ({ kind: "straight", length, angle } or { kind: "arc", radius, toAngle })' })
  .superRefine((list, ctx) => {
    for (const i of profileIssues(list))
      ctx.addIssue({
        code: "custom",
        path: i.path.split(".").slice(2).map((p) => (/^\d+$/.test(p) ? Number(p) : p)),
        message: i.message,
      });
  })
  .transform((list) => list as ProfilePiece[]);

/**
 * The lift's geometry and chain extent. `profile` (pieces) defines the track when given; otherwise the six
 * parametric fields build the 5-piece shortcut (they are then required, see crossFieldIssues). With a profile the
 * parametric fields are optional and ignored.
 */
export const liftSchema = z.object({
  approachLength: num("lift.approachLength", "m", { min: 0, max: 1000 }).optional(),
  sagRadius: num("lift.sagRadius", "m", { min: 1, max: 1000 }).optional(),
  angle: num("lift.angle", "degrees", { min: 2, max: 80 }).optional(),
  inclineLength: num("lift.inclineLength", "m", { min: 1, max: 2000 }).optional(),
  crestRadius: num("lift.crestRadius", "m", { min: 1, max: 1000 }).optional(),
  exitLength: num("lift.exitLength", "m", { min: 1, max: 1000 }).optional(),
  /** null or absent: the parametric fields build the track. */
  profile: profileSchema.nullable().optional(),
  chainFrom: num("lift.chainFrom", "m", { min: 0, max: 5000 }),
  chainTo: num("lift.chainTo", "m", { min: 0, max: 5000 }),
  dogRelease: num("lift.dogRelease", "m", { min: 0, max: 5000 }),
  /** Length of the bottom run linking drive sprocket, take-up sprocket and bottom idler. */
  bottomRun: num("lift.bottomRun", "m", { min: 0.5, max: 200 }).default(4),
}, section("lift"));

/** Chain fields of version 1 (kept for reading `tautline-scenario/1`). */
export const chainSchemaV1 = z.object({
  massPerLength: num("chain.massPerLength", "kg/m", { min: 0.5, max: 300 }),
  /** E·A: force per unit strain. */
  axialStiffness: num("chain.axialStiffness", "N per unit strain", { min: 1e5, max: 1e10 }),
  breakingStrength: num("chain.breakingStrength", "N", { min: 1e3, max: 1e8 }),
  pitch: num("chain.pitch", "m", { min: 0.005, max: 0.5 }),
  catchSpacing: num("chain.catchSpacing", "m", { min: 0.1, max: 200 }),
  /** Arc position of one catch point at t = 0; absent means `lift.chainFrom` (see catchOffsetOf). */
  catchOffset: num("chain.catchOffset", "m", { min: 0, max: 5000 }).optional(),
  guideFriction: num("chain.guideFriction", "", { min: 0, max: 0.5 }).default(0.02),
  /**
   * Internal (Kelvin–Voigt) damping: segment tension T = E·A·ε + damping·dε/dt, in N·s (N per unit
   * strain rate). 0 means no internal damping. The default damps the shortest waves of a 60-segment
   * mesh of the example chain at a few % of critical and leaves the slow modes practically undamped.
   */
  damping: num("chain.damping", "N·s", { min: 0, max: 1e9 }).default(2000),
}, section("chain"));

/**
 * Default loss factor of the chain's stretch: 0.02 (assumption: a loss factor of a few hundredths is typical
 * of bolted and pinned steel assemblies with joint friction; calibrate it from recordings).
 */
export const DEFAULT_LOSS_FACTOR = 0.02;

export const chainSchema = chainSchemaV1.extend({
  /**
   * Loss factor η of the chain's stretch (dimensionless), the same for every segment whatever the mesh:
   * a Zener element per segment tuned so that η holds at the train–chain surge frequencies (see sim/README.md).
   * 0 = none; with `damping` 0 too the chain is undamped.
   */
  lossFactor: num("chain.lossFactor", "", { min: 0, max: 0.5 }).default(DEFAULT_LOSS_FACTOR),
  /**
   * Wear as elongation (pitch growth), a fraction of the new length (e.g. 0.015 = 1.5 %); absent means a new chain.
   * The loop lengthens, pitch and catch spacing grow, E·A stays; the take-up starts lower (see sim/wear.ts).
   */
  elongation: num("chain.elongation", "fraction of length", { min: 0, max: 0.1 }).optional(),
  /**
   * Pitches taken out of the loop since the chain was new (maintenance shortening a worn chain); absent means
   * none. The loop shortens by linksRemoved × the worn pitch and the take-up starts that much / 2 higher.
   */
  linksRemoved: num("chain.linksRemoved", "links", { min: 0, max: 5000, int: true }).optional(),
});

/** Drive fields of version 1. */
export const driveSchemaV1 = z.object({
  speed: num("drive.speed", "m/s", { gt: 0, max: 10 }),
  rampTime: num("drive.rampTime", "s", { min: 0, max: 120 }).default(2),
  sprocketTeeth: num("drive.sprocketTeeth", "teeth", { min: 5, max: 120, int: true }),
  efficiency: num("drive.efficiency", "", { min: 0.2, max: 1 }).default(0.9),
}, section("drive"));

export const DRIVE_LOCATIONS = ["bottom", "top"] as const;
export const MOTOR_KINDS = ["ideal", "induction", "speed-loop"] as const;
export const STOP_KINDS = ["brake", "power-loss"] as const;

/** Prescribed chain speed (the version 1 drive): the sprocket follows the ramp whatever the load. */
export const idealMotorSchema = z.object({ kind: z.literal("ideal") });

/**
 * Induction motor on the Kloss curve. `speed` is the synchronous (no-load) chain speed; the rated pull at the
 * chain is F_r = ratedPower·efficiency / (speed·(1 − ratedSlip)); F = 2·λ·F_r / (s/s_b + s_b/s) with
 * λ = breakdownRatio and s_b = ratedSlip·(λ + √(λ² − 1)). `reflectedMass` = J·(i/r)², the rotating
 * inertia of motor, gearbox and sprocket seen at the chain. Defaults: a 160 kW lift motor (assumption);
 * rated slip 1.5 % and breakdown ratio 2.3 are typical of standard four-pole motors of that size (IEC 60034-1
 * design N class; Chapman, Electric Machinery Fundamentals).
 */
export const inductionMotorSchema = z.object({
  kind: z.literal("induction"),
  ratedPower: num("drive.motor.ratedPower", "W", { gt: 0, max: 1e7 }).default(160000),
  ratedSlip: num("drive.motor.ratedSlip", "", { min: 0.001, max: 0.2 }).default(0.015),
  breakdownRatio: num("drive.motor.breakdownRatio", "", { min: 1.05, max: 5 }).default(2.3),
  reflectedMass: num("drive.motor.reflectedMass", "kg", { min: 0, max: 1e7 }).default(12000),
});

/**
 * A PI speed loop on the chain speed reference (the ramp), saturating at `forceLimit`. Defaults are
 * assumptions: 1 Hz bandwidth (a drive tuned well below the chain's wave frequencies), 250 kN pull limit.
 */
export const speedLoopMotorSchema = z.object({
  kind: z.literal("speed-loop"),
  bandwidth: num("drive.motor.bandwidth", "Hz", { gt: 0, max: 50 }).default(1),
  forceLimit: num("drive.motor.forceLimit", "N", { gt: 0, max: 1e8 }).default(250000),
  reflectedMass: num("drive.motor.reflectedMass", "kg", { min: 0, max: 1e7 }).default(12000),
});

const MOTOR_KIND_ERROR = `drive.motor.kind must be one of ${MOTOR_KINDS.join(", ")}`;

export const motorSchema = z.discriminatedUnion(
  "kind",
  [idealMotorSchema, inductionMotorSchema, speedLoopMotorSchema],
  { error: (iss) => (iss.input === undefined || typeof iss.input !== "object" ? "drive.motor must be an object" : MOTOR_KIND_ERROR) },
);

/**
 * A stop on the lift. "brake": the chain speed goes to zero over `duration` and is held; "power-loss": the
 * motor pull drops to zero at `time` and a brake holds the sprocket after `duration`.
 */
export const stopSchema = z.object({
  time: num("drive.stop.time", "s", { min: 0, max: 600 }),
  kind: z.enum(STOP_KINDS, { error: `drive.stop.kind must be one of ${STOP_KINDS.join(", ")}` }).default("brake"),
  duration: num("drive.stop.duration", "s", { min: 0, max: 60 }).default(0.5),
}, section("drive.stop"));

/** A restart after a stop: the drive ramps up again over `rampTime` from `time`. */
export const restartSchema = z.object({
  time: num("drive.restart.time", "s", { gt: 0, max: 600 }),
}, section("drive.restart"));

export const driveSchema = driveSchemaV1.extend({
  location: z
    .enum(DRIVE_LOCATIONS, { error: `drive.location must be one of ${DRIVE_LOCATIONS.join(", ")}` })
    .default("bottom"),
  motor: motorSchema.default(() => inductionMotorSchema.parse({ kind: "induction" })),
  stop: stopSchema.optional(),
  restart: restartSchema.optional(),
});

/** Take-up fields of version 1. */
export const takeUpSchemaV1 = z.object({
  mass: num("takeUp.mass", "kg", { min: 10, max: 200000 }),
  travel: num("takeUp.travel", "m", { min: 0.05, max: 50 }),
  /** Initial distance below the top stop. */
  position: num("takeUp.position", "m", { min: 0, max: 50 }),
  friction: num("takeUp.friction", "N", { min: 0, max: 1e6 }).default(0),
}, section("takeUp"));

export const takeUpSchema = takeUpSchemaV1.extend({
  /** Dashpot on the counterweight, N·s/m (0 = none). */
  damping: num("takeUp.damping", "N·s/m", { min: 0, max: 1e8 }).default(0),
});

/** The single train of version 1. */
export const trainSchemaV1 = z.object({
  cars: num("train.cars", "cars", { min: 1, max: 40, int: true }),
  carMass: num("train.carMass", "kg", { min: 10, max: 50000 }),
  carLength: num("train.carLength", "m", { min: 0.3, max: 30 }),
  dogOffset: num("train.dogOffset", "m", { min: 0, max: 1200 }),
  rollingResistance: num("train.rollingResistance", "", { min: 0, max: 0.2 }).default(0.015),
  dragArea: num("train.dragArea", "m²", { min: 0, max: 100 }).default(1),
  entrySpeed: num("train.entrySpeed", "m/s", { min: 0, max: 30 }).default(0),
  startPosition: num("train.startPosition", "m", { min: 0, max: 5000 }),
}, section("train"));

// "*" in a message stands for the list index; parseScenario puts the real index in (e.g. trains.1.cars).
export const MAX_TRAINS = 20;
export const MAX_PAWLS = 8;

/** One train of `trains`. */
export const trainSchema = z.object({
  cars: num("trains.*.cars", "cars", { min: 1, max: 40, int: true }),
  carMass: num("trains.*.carMass", "kg", { min: 10, max: 50000 }),
  carLength: num("trains.*.carLength", "m", { min: 0.3, max: 30 }),
  dogOffset: num("trains.*.dogOffset", "m", { min: 0, max: 1200 }),
  rollingResistance: num("trains.*.rollingResistance", "", { min: 0, max: 0.2 }).default(0.015),
  dragArea: num("trains.*.dragArea", "m²", { min: 0, max: 100 }).default(1),
  entrySpeed: num("trains.*.entrySpeed", "m/s", { min: 0, max: 30 }).default(0),
  startPosition: num("trains.*.startPosition", "m", { min: 0, max: 5000 }),
  /** When the train appears at startPosition with entrySpeed, s. */
  startTime: num("trains.*.startTime", "s", { min: 0, max: 600 }).default(0),
  /** ARD pawls, m behind the front; absent means one pawl at the dog (see pawlsOf). */
  pawls: z
    .array(num("trains.*.pawls.*", "m", { min: 0, max: 1200 }), { error: "trains.*.pawls must be a list of positions (m)" })
    .min(1, { error: "trains.*.pawls must list at least one pawl" })
    .max(MAX_PAWLS, { error: `trains.*.pawls must list at most ${MAX_PAWLS} pawls` })
    .optional(),
}, { error: "trains.* must be an object (a train)" });

export const antiRollbackSchema = z.object({
  enabled: bool("antiRollback.enabled").default(true),
  from: num("antiRollback.from", "m", { min: 0, max: 5000 }),
  to: num("antiRollback.to", "m", { min: 0, max: 5000 }),
  toothSpacing: num("antiRollback.toothSpacing", "m", { min: 0.02, max: 5 }),
}, section("antiRollback"));

export const INTEGRATORS = ["verlet", "odex"] as const;

export const runSettingsSchemaV1 = z.object({
  duration: num("run.duration", "s", { gt: 0, max: 600 }),
  segments: num("run.segments", "segments", { min: 4, max: 2000, int: true }).default(60),
  /** "verlet": fixed-step velocity Verlet (default, fast); "odex": adaptive extrapolation (reference). */
  integrator: z
    .enum(INTEGRATORS, { error: `run.integrator must be one of ${INTEGRATORS.join(", ")}` })
    .default("verlet"),
  /** Verlet step as a fraction of the computed stability limit. */
  stepFraction: num("run.stepFraction", "", { min: 0.05, max: 0.95 }).default(0.6),
  /** odex relative tolerance (absolute tolerances are scaled per state from it). */
  tolerance: num("run.tolerance", "", { min: 1e-10, max: 1e-2 }).default(1e-6),
  /** Dog and ARD contact stiffness; absent means E·A / 1 m (as stiff as one metre of chain). */
  contactStiffness: num("run.contactStiffness", "N/m", { gt: 0, max: 1e11 }).optional(),
  /** Take-up end-stop stiffness; absent means 20 × the take-up's own static stiffness (4·E·A/loop length). */
  endStopStiffness: num("run.endStopStiffness", "N/m", { gt: 0, max: 1e11 }).optional(),
  /** Damping ratio of the contacts (dog, ARD pawl, end stops). */
  contactDamping: num("run.contactDamping", "", { min: 0, max: 2 }).default(0.1),
  gravity: num("run.gravity", "m/s²", { min: 0.1, max: 30 }).default(9.80665),
  airDensity: num("run.airDensity", "kg/m³", { min: 0, max: 5 }).default(1.2),
}, section("run"));

/** Version 2 run settings: the dog and ARD contacts moved to the physical `contacts` section. */
export const runSettingsSchema = runSettingsSchemaV1.omit({ contactStiffness: true, contactDamping: true });

/**
 * Physical contacts, independent of E·A and of the mesh. Defaults stand for steel parts: a dog or pawl
 * seat of hardened steel deflects about 1 mm under 50 kN (5e7 N/m, assumption from the size of the parts);
 * damping ratio 0.1 (assumption; steel-on-steel impacts have a coefficient of restitution near 0.7, which
 * a damping ratio of about 0.1 reproduces for a linear contact).
 */
export const contactsSchema = z.object({
  dogStiffness: num("contacts.dogStiffness", "N/m", { min: 1e4, max: 1e11 }).default(5e7),
  ardStiffness: num("contacts.ardStiffness", "N/m", { min: 1e4, max: 1e11 }).default(5e7),
  dampingRatio: num("contacts.dampingRatio", "", { min: 0, max: 2 }).default(0.1),
}, section("contacts"));

/** Check limits used by evaluateChecks; each default's source (or "assumption") is in LIMIT_SOURCES. */
export const limitsSchema = z.object({
  requiredSafetyFactor: num("limits.requiredSafetyFactor", "", { min: 1, max: 50 }).default(5),
  maxSnatchFactor: num("limits.maxSnatchFactor", "", { min: 1, max: 20 }).default(2),
  motorRating: num("limits.motorRating", "W", { gt: 0, max: 1e8 }).optional(),
  /** Rider-acceleration envelope (filtered longitudinal acceleration, g, and the longest time above it, s). */
  maxRiderAccel: num("limits.maxRiderAccel", "g", { gt: 0, max: 10 }).default(0.5),
  riderAccelBriefDuration: num("limits.riderAccelBriefDuration", "s", { min: 0, max: 60 }).default(0.5),
  riderAccelSustained: num("limits.riderAccelSustained", "g", { gt: 0, max: 10 }).default(0.3),
  riderAccelSustainedDuration: num("limits.riderAccelSustainedDuration", "s", { min: 0, max: 600 }).default(2),
  riderAccelCeiling: num("limits.riderAccelCeiling", "g", { gt: 0, max: 10 }).default(1),
  riderAccelBackwardScale: num("limits.riderAccelBackwardScale", "", { gt: 0, max: 10 }).default(1),
  allowRollback: bool("limits.allowRollback").default(false),
  maxPickupDelay: num("limits.maxPickupDelay", "s", { gt: 0, max: 60 }).default(1.5),
  maxTimeToChainSpeed: num("limits.maxTimeToChainSpeed", "s", { gt: 0, max: 120 }).default(3),
  /** Chain working load: the maker's allowable working load, N, or else this fraction of breaking strength. */
  allowableWorkingLoad: num("limits.allowableWorkingLoad", "N", { gt: 0, max: 1e8 }).optional(),
  workingLoadFraction: num("limits.workingLoadFraction", "", { gt: 0, max: 1 }).default(1 / 7),
  /** Breaking strength over ASME B29.1's 12,500·P² lbf: outside this band is a caution. */
  minBreakingRatio: num("limits.minBreakingRatio", "", { min: 0, max: 100 }).default(1),
  maxBreakingRatio: num("limits.maxBreakingRatio", "", { gt: 0, max: 100 }).default(4),
  wearAllowance: num("limits.wearAllowance", "% elongation", { min: 0, max: 10 }).default(3),
  thermalDeltaT: num("limits.thermalDeltaT", "K", { min: 0, max: 200 }).default(40),
  thermalExpansion: num("limits.thermalExpansion", "1/K", { min: 0, max: 1e-4 }).default(11.7e-6),
  /** Kinetic energy at the dog's release over the energy needed to clear the crest (dimensionless ratio). */
  releaseEnergyMargin: num("limits.releaseEnergyMargin", "ratio", { min: 1, max: 10 }).default(1.25),
}, section("limits"));

/** Where each default limit comes from. Results support, and never replace, review by a qualified engineer. */
export const LIMIT_SOURCES: Record<keyof z.output<typeof limitsSchema>, string> = {
  requiredSafetyFactor:
    "5 on ultimate strength, by analogy to hoisting roller chain (MIL-H-904J factor of safety 5; German hoist rules breaking/working ≥ 5). Assumption for a lift chain; local codes govern.",
  maxSnatchFactor:
    "2: a suddenly applied load on a spring–mass peaks at twice its static value (e.g. Rao, Mechanical Vibrations). Assumption as a limit.",
  motorRating: "The installed motor's rating: the user's input (no default).",
  maxRiderAccel:
    "0.5 g, exceeded for at most the brief duration at a time (filtered longitudinal acceleration): assumption, not the standard's number. Patron acceleration limits are set by ASTM F2291 (by axis, direction and duration); enter your organisation's envelope from it — its numbers are not reproduced here.",
  riderAccelBriefDuration: "0.5 s, the longest time the brief level may be exceeded: assumption.",
  riderAccelSustained:
    "0.3 g, exceeded for at most the sustained duration at a time: assumption, not the standard's number (ASTM F2291 governs).",
  riderAccelSustainedDuration: "2 s, the longest time the sustained level may be exceeded: assumption.",
  riderAccelCeiling: "1 g never exceeded, however briefly (filtered): assumption, not the standard's number (ASTM F2291 governs).",
  riderAccelBackwardScale:
    "1: the envelope's levels for slowing (rider pitched forward) are the forward levels × this: assumption; the standard's allowances differ by direction.",
  allowRollback:
    "false: any train settling back onto the ARD fails the check. A rollback of more than one tooth spacing always fails (the model's definition of an ARD failure).",
  maxPickupDelay: "1.5 s from first dog contact until the dog carries the train's load: assumption.",
  maxTimeToChainSpeed: "3 s from first dog contact until the train runs within 5 % of chain speed: assumption.",
  allowableWorkingLoad:
    "The chain maker's allowable working load (fatigue-rated), N: the user's input from the maker's data (no default; the working load fraction applies without it).",
  workingLoadFraction:
    "1/7 of breaking strength when no allowable working load is given: assumption (chain makers limit working load to roughly 1/6–1/9 of ultimate strength).",
  minBreakingRatio:
    "1: breaking strength at least ASME B29.1's minimum ultimate tensile strength for standard roller chain, 12,500·P² lbf per strand (P in inches); below it is a caution (non-standard chain, or check the input).",
  maxBreakingRatio:
    "4 × ASME B29.1's 12,500·P² lbf: assumption (about four strands); above it is a caution (check the input or the chain type).",
  wearAllowance:
    "3 % elongation: replace roller chain at about 3 % (lower, ≈1.5 %, where fixed centres matter): common practice, no source.",
  thermalDeltaT: "40 K between installation and the extreme service temperature: assumption.",
  thermalExpansion: "11.7e-6 /K for carbon steel: from memory.",
  releaseEnergyMargin:
    "1.25: the train's kinetic energy at the dog's release must exceed the energy to clear the crest by a quarter (assumption; covers wind, wheel drag and rolling resistance above the model's). Set it from the ride's data.",
};

const scenarioHead = {
  name: z
    .string({ error: "name must be text" })
    .trim()
    .min(1, { error: "name must not be empty" })
    .max(200, { error: "name must be at most 200 characters" }),
  description: z.string({ error: "description must be text" }).max(5000).optional(),
};

const FORMAT_ERROR = `format must be "${SCENARIO_FORMAT}" (or "${SCENARIO_FORMAT_V1}", converted on reading)`;

const baseScenarioSchemaV1 = z.object({
  format: z.literal(SCENARIO_FORMAT_V1, { error: FORMAT_ERROR }),
  ...scenarioHead,
  lift: liftSchema,
  chain: chainSchemaV1,
  drive: driveSchemaV1,
  takeUp: takeUpSchemaV1,
  train: trainSchemaV1,
  antiRollback: antiRollbackSchema,
  run: runSettingsSchemaV1,
  limits: limitsSchema.default(() => limitsSchema.parse({})),
}, { error: "the scenario must be a JSON object" });

const baseScenarioSchema = z.object({
  format: z.literal(SCENARIO_FORMAT, { error: FORMAT_ERROR }),
  ...scenarioHead,
  lift: liftSchema,
  chain: chainSchema,
  drive: driveSchema,
  takeUp: takeUpSchema,
  contacts: contactsSchema.default(() => contactsSchema.parse({})),
  trains: z
    .array(trainSchema, { error: "trains must be a list of trains" })
    .min(1, { error: "trains must list at least one train" })
    .max(MAX_TRAINS, { error: `trains must list at most ${MAX_TRAINS} trains` }),
  antiRollback: antiRollbackSchema,
  run: runSettingsSchema,
  limits: limitsSchema.default(() => limitsSchema.parse({})),
}, { error: "the scenario must be a JSON object" });

const SECTION_SHAPES = {
  lift: liftSchema.shape,
  chain: chainSchema.shape,
  drive: driveSchema.shape,
  takeUp: takeUpSchema.shape,
  train: trainSchemaV1.shape,
  antiRollback: antiRollbackSchema.shape,
  run: runSettingsSchemaV1.shape,
};

export interface FieldIssue {
  path: string;
  message: string;
}

const isNum = (v: unknown): v is number => typeof v === "number" && Number.isFinite(v);

/** Total track length: approach + sag arc + incline + crest arc + exit (the parametric lift's five pieces). */
export function trackLength(l: {
  approachLength: number;
  sagRadius: number;
  angle: number;
  inclineLength: number;
  crestRadius: number;
  exitLength: number;
}): number {
  return profileLength(parametricProfile(l));
}

function get(obj: unknown, section: string, key: string): unknown {
  if (!obj || typeof obj !== "object") return undefined;
  const s = (obj as Record<string, unknown>)[section];
  if (!s || typeof s !== "object") return undefined;
  return (s as Record<string, unknown>)[key];
}

/**
 * Checks between fields. Works on raw input too: a rule runs only when the fields it needs are numbers,
 * so a scenario with both a bad field and an inconsistency reports both at once.
 */
export function crossFieldIssues(data: unknown): FieldIssue[] {
  const out: FieldIssue[] = [];
  // Only values that pass their own field rule take part, so one bad field does not produce misleading noise.
  const n = (sec: keyof typeof SECTION_SHAPES, key: string) => {
    const v = get(data, sec, key);
    const field = (SECTION_SHAPES[sec] as Record<string, z.ZodType>)[key];
    return isNum(v) && field && field.safeParse(v).success ? v : undefined;
  };
  // The track length: from a valid profile when one is given, else from the parametric fields (then required).
  const rawProfile = get(data, "lift", "profile");
  let L: number | undefined;
  if (rawProfile !== undefined && rawProfile !== null) {
    if (profileIssues(rawProfile).length === 0) L = profileLength(rawProfile as ProfilePiece[]);
  } else {
    const lift = PARAMETRIC_FIELDS.map((k) => n("lift", k));
    const liftSection = data && typeof data === "object" ? (data as Record<string, unknown>).lift : undefined;
    if (liftSection && typeof liftSection === "object" && !Array.isArray(liftSection))
      PARAMETRIC_FIELDS.forEach((k) => {
        if (get(data, "lift", k) === undefined)
          out.push({ path: `lift.${k}`, message: `lift.${k} is required when lift.profile is not given (${k === "angle" ? "degrees" : "m"})` });
      });
    if (lift.every(isNum))
      L = trackLength({
        approachLength: lift[0]!,
        sagRadius: lift[1]!,
        angle: lift[2]!,
        inclineLength: lift[3]!,
        crestRadius: lift[4]!,
        exitLength: lift[5]!,
      });
  }
  const Ls = L !== undefined ? L.toFixed(2) : "";
  const from = n("lift", "chainFrom");
  const to = n("lift", "chainTo");
  if (from !== undefined && to !== undefined && !(from < to))
    out.push({ path: "lift.chainTo", message: "lift.chainTo must be greater than lift.chainFrom" });
  if (to !== undefined && L !== undefined && to > L)
    out.push({ path: "lift.chainTo", message: `lift.chainTo must not exceed the track length ${Ls} m` });
  const rel = n("lift", "dogRelease");
  if (rel !== undefined && from !== undefined && to !== undefined && (rel <= from || rel > to))
    out.push({
      path: "lift.dogRelease",
      message: "lift.dogRelease must lie within the chain (greater than lift.chainFrom, at most lift.chainTo)",
    });
  const co = n("chain", "catchOffset");
  if (co !== undefined && from !== undefined && to !== undefined && (co < from || co > to))
    out.push({
      path: "chain.catchOffset",
      message: "chain.catchOffset must lie on the carrying strand (lift.chainFrom … lift.chainTo)",
    });
  const cs = n("chain", "catchSpacing");
  if (cs !== undefined && from !== undefined && to !== undefined && cs > to - from)
    out.push({ path: "chain.catchSpacing", message: "chain.catchSpacing must not exceed the chained length" });
  const pitch = n("chain", "pitch");
  if (pitch !== undefined && cs !== undefined && pitch > cs)
    out.push({ path: "chain.pitch", message: "chain.pitch must not exceed chain.catchSpacing" });
  const arFrom = n("antiRollback", "from");
  const arTo = n("antiRollback", "to");
  if (arFrom !== undefined && arTo !== undefined && !(arFrom < arTo))
    out.push({ path: "antiRollback.to", message: "antiRollback.to must be greater than antiRollback.from" });
  if (arTo !== undefined && L !== undefined && arTo > L)
    out.push({ path: "antiRollback.to", message: `antiRollback.to must not exceed the track length ${Ls} m` });
  const ts = n("antiRollback", "toothSpacing");
  if (ts !== undefined && arFrom !== undefined && arTo !== undefined && arFrom < arTo && ts > arTo - arFrom)
    out.push({
      path: "antiRollback.toothSpacing",
      message: "antiRollback.toothSpacing must not exceed the ratchet length (antiRollback.to − antiRollback.from)",
    });
  // Trains: the single `train` of version 1, or each of `trains`.
  const trainList = Array.isArray((data as { trains?: unknown })?.trains)
    ? ((data as { trains: unknown[] }).trains)
    : undefined;
  const trainChecks: { prefix: string; value: (key: string) => number | undefined; pawls?: unknown }[] = [];
  if (trainList) {
    trainList.forEach((t, i) => {
      const field = trainSchema.shape as Record<string, z.ZodType>;
      const value = (key: string) => {
        const v = t && typeof t === "object" ? (t as Record<string, unknown>)[key] : undefined;
        return isNum(v) && field[key] && field[key].safeParse(v).success ? v : undefined;
      };
      trainChecks.push({ prefix: `trains.${i}`, value, pawls: t && typeof t === "object" ? (t as Record<string, unknown>).pawls : undefined });
    });
  } else trainChecks.push({ prefix: "train", value: (key) => n("train", key) });
  for (const tc of trainChecks) {
    const sp = tc.value("startPosition");
    if (sp !== undefined && L !== undefined && sp >= L)
      out.push({ path: `${tc.prefix}.startPosition`, message: `${tc.prefix}.startPosition must lie on the track (below ${Ls} m)` });
    const cars = tc.value("cars");
    const carLength = tc.value("carLength");
    const dog = tc.value("dogOffset");
    const length = cars !== undefined && carLength !== undefined ? cars * carLength : undefined;
    if (dog !== undefined && length !== undefined && dog > length)
      out.push({
        path: `${tc.prefix}.dogOffset`,
        message: `${tc.prefix}.dogOffset must not exceed the train length (${tc.prefix}.cars × ${tc.prefix}.carLength)`,
      });
    if (Array.isArray(tc.pawls) && length !== undefined)
      tc.pawls.forEach((p, k) => {
        if (isNum(p) && p > length)
          out.push({
            path: `${tc.prefix}.pawls.${k}`,
            message: `${tc.prefix}.pawls.${k} must not exceed the train length ${length.toFixed(2)} m (pawls are metres behind the front)`,
          });
      });
  }
  // Trains that appear together must not overlap (a train occupies startPosition − cars·carLength … startPosition).
  const extents = trainChecks.map((tc) => {
    const front = tc.value("startPosition");
    const cars = tc.value("cars");
    const carLength = tc.value("carLength");
    const at = tc.value("startTime") ?? 0;
    return front !== undefined && cars !== undefined && carLength !== undefined ? { front, rear: front - cars * carLength, at } : undefined;
  });
  extents.forEach((b, j) => {
    if (!b) return;
    for (let i = 0; i < j; i++) {
      const a = extents[i];
      if (!a || a.at !== b.at || !(b.front > a.rear + 1e-9 && a.front > b.rear + 1e-9)) continue;
      out.push({
        path: `trains.${j}.startPosition`,
        message: `trains.${j} overlaps trains.${i} at their start time ${b.at} s (trains.${j}: ${b.rear.toFixed(2)}–${b.front.toFixed(2)} m, trains.${i}: ${a.rear.toFixed(2)}–${a.front.toFixed(2)} m); set trains.${j}.startPosition at least a train length apart (m)`,
      });
      break;
    }
  });
  const stop = get(data, "drive", "stop");
  const restart = get(data, "drive", "restart");
  const stopTime = stop && typeof stop === "object" ? (stop as Record<string, unknown>).time : undefined;
  const restartTime = restart && typeof restart === "object" ? (restart as Record<string, unknown>).time : undefined;
  if (isNum(restartTime) && restartTime > 0 && stop === undefined)
    out.push({ path: "drive.restart", message: "drive.restart needs a drive.stop before it" });
  if (isNum(restartTime) && isNum(stopTime) && stopTime >= 0 && restartTime <= stopTime)
    out.push({ path: "drive.restart.time", message: "drive.restart.time must be later than drive.stop.time (s)" });
  const pos = n("takeUp", "position");
  const travel = n("takeUp", "travel");
  if (pos !== undefined && travel !== undefined && pos > travel)
    out.push({ path: "takeUp.position", message: "takeUp.position must not exceed takeUp.travel" });
  const el = n("chain", "elongation");
  const removed = n("chain", "linksRemoved");
  const bottomRun = n("lift", "bottomRun") ?? 4;
  const worn = (el !== undefined && el > 0) || (removed !== undefined && removed > 0);
  if (worn && pos !== undefined && travel !== undefined && from !== undefined && to !== undefined && from < to && pos <= travel) {
    const e = el ?? 0;
    const drop = wearDrop({ chainFrom: from, chainTo: to, bottomRun }, e, removed ?? 0, pitch ?? 0);
    const what = removed
      ? `chain.elongation ${e} with ${removed} links removed changes the loop by ${(2 * drop).toFixed(3)} m`
      : `chain.elongation ${e} lengthens the loop by ${(2 * drop).toFixed(3)} m`;
    if (pos + drop > travel)
      out.push({
        path: "chain.elongation",
        message: `${what}: the take-up would start ${(pos + drop).toFixed(3)} m below its top stop, past takeUp.travel ${travel} m (shorten the chain or reset the take-up)`,
      });
    else if (pos + drop < 0)
      out.push({
        path: "chain.linksRemoved",
        message: `${what}: the take-up would start ${(-(pos + drop)).toFixed(3)} m above its top stop (the chain would be too short: fewer links removed)`,
      });
  }
  return out;
}

const withCrossFields = (ctx: z.RefinementCtx, data: unknown) => {
  for (const i of crossFieldIssues(data))
    ctx.addIssue({ code: "custom", path: i.path.split(".").map((p) => (/^\d+$/.test(p) ? Number(p) : p)), message: i.message });
};

/** Version 2, the current format. */
export const scenarioSchema = baseScenarioSchema.superRefine((s, ctx) => withCrossFields(ctx, s));
/** Version 1, read and converted by parseScenario. */
export const scenarioV1Schema = baseScenarioSchemaV1.superRefine((s, ctx) => withCrossFields(ctx, s));

export type Scenario = z.output<typeof scenarioSchema>;
export type ScenarioInput = z.input<typeof scenarioSchema>;
export type ScenarioV1 = z.output<typeof scenarioV1Schema>;
export type ScenarioV1Input = z.input<typeof scenarioV1Schema>;
export type LiftSettings = z.output<typeof liftSchema>;
export type ChainSettings = z.output<typeof chainSchema>;
export type DriveSettings = z.output<typeof driveSchema>;
export type MotorSettings = z.output<typeof motorSchema>;
export type StopSettings = z.output<typeof stopSchema>;
export type RestartSettings = z.output<typeof restartSchema>;
export type DriveLocation = (typeof DRIVE_LOCATIONS)[number];
export type TakeUpSettings = z.output<typeof takeUpSchema>;
export type TrainSettings = z.output<typeof trainSchema>;
export type ContactSettings = z.output<typeof contactsSchema>;
export type AntiRollbackSettings = z.output<typeof antiRollbackSchema>;
export type RunSettings = z.output<typeof runSettingsSchema>;
export type Limits = z.output<typeof limitsSchema>;
export type Integrator = (typeof INTEGRATORS)[number];

export type ParseResult = { ok: true; scenario: Scenario } | { ok: false; issues: FieldIssue[] };

/** True for a `tautline-scenario/1` document (read through upgradeScenario). */
export function isV1(data: unknown): boolean {
  return !!data && typeof data === "object" && (data as { format?: unknown }).format === SCENARIO_FORMAT_V1;
}

/** A document of unknown format in the version 1 shape (one `train`, no `trains`) is checked as version 1. */
function looksLikeV1(data: unknown): boolean {
  if (!data || typeof data !== "object") return false;
  const d = data as Record<string, unknown>;
  return d.format !== SCENARIO_FORMAT && "train" in d && !("trains" in d);
}

/**
 * Version 1's dog and pawl contact stiffness, E·A / max(1 m, strand segment / 4), at the file's own mesh
 * (run.segments): kept for converted files so their figures stay as they were.
 */
export function v1ContactStiffness(s: ScenarioV1): number {
  if (s.run.contactStiffness !== undefined) return s.run.contactStiffness;
  const Lc = s.lift.chainTo - s.lift.chainFrom;
  const { ns } = meshCounts(Lc, s.lift.bottomRun, s.run.segments);
  return s.chain.axialStiffness / Math.max(1, Lc / ns / 4);
}

/**
 * Pure conversion of a validated `tautline-scenario/1` scenario to version 2. What version 1 meant is kept:
 * an ideal drive (prescribed chain speed) at the bottom, no chain loss factor, no take-up dashpot, the
 * contact stiffness version 1 used at the file's mesh (`run.contactStiffness`, or E·A / max(1 m, strand
 * segment / 4)) and its damping ratio (`run.contactDamping`); `train` becomes `trains[0]`, appearing at
 * t = 0 with one pawl at its dog. Physics version 2 changed for every file (contact damping from the train's
 * mass, the catch lattice's leftover gap away from the catch placed, a standing train on a catch starting
 * engaged) applies to converted files too.
 */
export function upgradeScenario(v1: ScenarioV1): Scenario {
  const k = v1ContactStiffness(v1);
  const { contactStiffness: _k, contactDamping, ...run } = v1.run;
  void _k;
  return {
    format: SCENARIO_FORMAT,
    name: v1.name,
    ...(v1.description !== undefined ? { description: v1.description } : {}),
    lift: { ...v1.lift },
    chain: { ...v1.chain, lossFactor: 0 },
    drive: { ...v1.drive, location: "bottom", motor: { kind: "ideal" } },
    takeUp: { ...v1.takeUp, damping: 0 },
    contacts: { dogStiffness: k, ardStiffness: k, dampingRatio: contactDamping },
    trains: [{ ...v1.train, startTime: 0, pawls: [v1.train.dogOffset] }],
    antiRollback: { ...v1.antiRollback },
    run,
    limits: { ...v1.limits },
  };
}

function issuesOf(error: z.ZodError, data: unknown): FieldIssue[] {
  const issues: FieldIssue[] = error.issues.map((i) => {
    const path = i.path.length ? i.path.map(String).join(".") : "(scenario)";
    // Put the list indexes into messages written for any train ("trains.*.cars" → "trains.1.cars").
    const idx = i.path.filter((p) => typeof p === "number").map(String);
    const message = i.message.replace(/\.\*/g, () => `.${idx.shift() ?? "*"}`);
    return { path, message };
  });
  // Cross-field rules do not run in zod when a field failed; run them on the raw input as well.
  const seen = new Set(issues.map((i) => `${i.path}|${i.message}`));
  for (const i of crossFieldIssues(data)) {
    const key = `${i.path}|${i.message}`;
    if (!seen.has(key) && !issues.some((j) => j.path === i.path)) {
      issues.push(i);
      seen.add(key);
    }
  }
  return issues;
}

/**
 * Validates a scenario (version 2, or version 1 converted by upgradeScenario) and lists every problem at
 * once, each with a dotted field path. Always returns the version 2 shape.
 */
export function parseScenario(data: unknown): ParseResult {
  if (isV1(data) || looksLikeV1(data)) {
    const r1 = scenarioV1Schema.safeParse(data);
    if (!r1.success) return { ok: false, issues: issuesOf(r1.error, data) };
    return { ok: true, scenario: upgradeScenario(r1.data) };
  }
  const r = scenarioSchema.safeParse(data);
  if (r.success) return { ok: true, scenario: r.data };
  return { ok: false, issues: issuesOf(r.error, data) };
}

/** Positions of a train's ARD pawls, m behind its front (default: one pawl at the dog). */
export function pawlsOf(t: TrainSettings): number[] {
  return t.pawls && t.pawls.length ? t.pawls : [t.dogOffset];
}

/** The catch point that sits at a known arc position at t = 0 (default: the chain's start). */
export function catchOffsetOf(s: Scenario): number {
  return s.chain.catchOffset ?? s.lift.chainFrom;
}
