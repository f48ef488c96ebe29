/**
 * The scenario editor's drive model and damping fields: label, quantity (unit) and help text saying what
 * each one is and where its default comes from. Values are SI; paths are the scenario's `dynamics`.
 */
import type { FieldDef } from "@/components/ui/form-draft";

export type MotorKind = "ideal" | "induction" | "speed-loop";

export const MOTOR_KINDS: { kind: MotorKind; label: string; help: string }[] = [
  {
    kind: "ideal",
    label: "Ideal (prescribed chain speed)",
    help: "The chain moves at the set speed whatever the load: no slip, and the drive absorbs nothing (every wave is reflected). Format 1 files keep this drive.",
  },
  {
    kind: "induction",
    label: "Induction motor",
    help: "Pull follows the motor's slip curve (Kloss): under load the chain runs a little slower than synchronous speed, and the slip absorbs part of the surge. The chain speed field is the synchronous (no-load) chain speed.",
  },
  {
    kind: "speed-loop",
    label: "Speed loop (drive with speed control)",
    help: "A PI speed controller holds the chain speed reference, with a bandwidth and a force limit (e.g. a frequency converter with an encoder).",
  },
];

const D = "dynamics";

export const INDUCTION_FIELDS: FieldDef[] = [
  {
    path: `${D}.drive.motor.ratedPower`,
    label: "Rated motor power",
    q: "power",
    hint: "Nameplate output power. Rated pull at the chain = power × drive efficiency ÷ (speed × (1 − rated slip)). Source: the motor's data sheet.",
  },
  {
    path: `${D}.drive.motor.ratedSlip`,
    label: "Rated slip",
    q: "ratio",
    hint: "Slip at rated load as a fraction of synchronous speed (0.015 = 1.5 %). General-purpose motors of 50–300 kW: about 0.01–0.03 (induction-machine texts, e.g. Chapman; from memory).",
  },
  {
    path: `${D}.drive.motor.breakdownRatio`,
    label: "Breakdown torque ratio",
    q: "ratio",
    hint: "Breakdown (pull-out) torque ÷ rated torque: the top of the Kloss curve. General-purpose motors: about 2–2.5 (NEMA MG 1 Design B minimums; from memory).",
  },
  {
    path: `${D}.drive.motor.reflectedMass`,
    label: "Drive inertia at the chain",
    q: "mass",
    hint: "Rotating inertia of motor, brake disc, coupling and gearbox seen at the chain: J·(i/r)², J in kg·m², gear ratio i, sprocket pitch radius r. E.g. 3.2 kg·m² × (11.2 ÷ 0.18 m)² ≈ 12 t. Source: the drive's data.",
  },
];

export const SPEED_LOOP_FIELDS: FieldDef[] = [
  {
    path: `${D}.drive.motor.bandwidth`,
    label: "Speed-loop bandwidth",
    q: "frequency",
    hint: "How fast the speed controller corrects an error, Hz. Conveyor drives are commonly tuned to a few Hz: assumption; use the commissioning value.",
  },
  {
    path: `${D}.drive.motor.forceLimit`,
    label: "Force limit at the chain",
    q: "force",
    hint: "Largest pull the drive gives (its current limit through the gearing): the drive's data.",
  },
  {
    path: `${D}.drive.motor.reflectedMass`,
    label: "Drive inertia at the chain",
    q: "mass",
    hint: "Rotating inertia seen at the chain, J·(i/r)² (see the induction motor). Source: the drive's data.",
  },
];

export const STOP_FIELDS: FieldDef[] = [
  { path: `${D}.drive.stop.time`, label: "Stop at", q: "time", hint: "Time the stop begins, from the start of the run." },
  {
    path: `${D}.drive.stop.duration`,
    label: "Stop duration",
    q: "time",
    hint: "Brake: the time the chain takes to come to rest. Power loss: the time until the brake holds the sprocket.",
  },
];

export const RESTART_FIELD: FieldDef = {
  path: `${D}.drive.restart.time`,
  label: "Restart at",
  q: "time",
  optional: true,
  hint: "Time the drive starts again after the stop, from the start of the run (it ramps up over the lift's ramp time). Must be later than the stop. Empty: no restart.",
};

export const ELONGATION_FIELD: FieldDef = {
  path: `${D}.chain.elongation`,
  label: "Chain elongation (pitch growth)",
  q: "fraction",
  optional: true,
  hint: "Wear as growth of the chain's pitch over its new length, e.g. 1.5 %. It lengthens the loop, so the take-up starts lower in its travel. Empty: a new chain. The logbook's newest reading can set it (Run with today's chain).",
};

export const LINKS_REMOVED_FIELD: FieldDef = {
  path: `${D}.chain.linksRemoved`,
  label: "Links removed",
  q: "count",
  optional: true,
  hint: "Pitches taken out of the loop since the chain was new. The loop shortens by that many worn pitches, so the take-up starts higher. Empty: none. Run with today's chain sets it from the logbook's links-removed entries.",
};

export const TAKEUP_DAMPING_FIELDS: FieldDef[] = [
  {
    path: `${D}.takeUp.friction`,
    label: "Take-up friction",
    q: "force",
    optional: true,
    hint: "Coulomb friction of the counterweight carriage in its guides, N. Format default 0 (frictionless). A carriage on guide rollers or lined guides: a few per cent of the counterweight's weight (assumption).",
  },
  {
    path: `${D}.takeUp.damping`,
    label: "Take-up damping",
    q: "linearDamping",
    optional: true,
    hint: "A dashpot on the counterweight: force per unit speed, N·s/m. Format default 0 (none fitted).",
  },
];

export const CHAIN_DAMPING_FIELDS: FieldDef[] = [
  {
    path: `${D}.chain.damping`,
    label: "Chain internal damping",
    q: "damping",
    optional: true,
    hint: "Kelvin–Voigt damping of each chain segment, N·s (force per unit strain rate, as in format 1). Damps the mesh's shortest waves; does little for the slow surge. Default: the engine's (sim/README.md).",
  },
  {
    path: `${D}.chain.lossFactor`,
    label: "Chain loss factor",
    q: "ratio",
    optional: true,
    hint: "Loss factor η of the chain's stretch: each cycle loses 2π·η of the strain energy, the same for every segment whatever the mesh, so it damps the slow surge. 0 = none. Default: the engine's (sim/README.md).",
  },
];

export const CONTACT_FIELDS: FieldDef[] = [
  {
    path: `${D}.contacts.dogStiffness`,
    label: "Dog contact stiffness",
    q: "stiffness",
    optional: true,
    hint: "Stiffness of the train's dog against a catch point, N/m, independent of the chain and the mesh. Default: steel parts (the engine's default, an assumption).",
  },
  {
    path: `${D}.contacts.ardStiffness`,
    label: "ARD contact stiffness",
    q: "stiffness",
    optional: true,
    hint: "Stiffness of a pawl against an anti-rollback tooth, N/m. Default: steel parts (the engine's default, an assumption).",
  },
  {
    path: `${D}.contacts.dampingRatio`,
    label: "Contact damping ratio",
    q: "ratio",
    optional: true,
    hint: "Damping of each contact as a fraction of critical (sets how much a contact bounces). Default: the engine's (an assumption).",
  },
];

export const START_TIME_FIELD: FieldDef = {
  path: "startTime",
  label: "Train appears at",
  q: "time",
  hint: "When the train appears at its start position with its entry speed, s from the start of the run. Default 0.",
};

export const ALL_DYNAMICS_FIELDS: FieldDef[] = [
  ...INDUCTION_FIELDS,
  ...SPEED_LOOP_FIELDS,
  ...STOP_FIELDS,
  RESTART_FIELD,
  ELONGATION_FIELD,
  LINKS_REMOVED_FIELD,
  ...TAKEUP_DAMPING_FIELDS,
  ...CHAIN_DAMPING_FIELDS,
  ...CONTACT_FIELDS,
  START_TIME_FIELD,
];
