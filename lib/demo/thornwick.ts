/**
 * Demo: the Thornwick two-slope lift (invented), a lift given as a profile (`lift.profile`): a 20° kicker, a
 * 45° main incline, a crest onto a short level top where the dog lets go, and a first drop at −55°. Kept apart
 * from park.ts's other lifts so each demo lift is one block.
 */
import type { AntiRollbackSettings, DriveSettings, LiftSettings, TakeUpSettings } from "@/sim/schema";
import type { DemoLift, DemoScenario } from "./park";
import { EMBERLINE_CHAIN, type In } from "./parts";


/*
 * Track (arc positions from the station): level 15 m; arc R 40 m to 20° (ends 28.96 m); 25 m at 20° (53.96 m);
 * arc R 50 m to 45° (75.78 m); 45 m at 45° (120.78 m); crest arc R 25 m to 0° (140.42 m, 61.7 m high); level top
 * 20 m (160.42 m); arc R 20 m to −55° (179.61 m); first drop 30 m at −55° (209.61 m). The chain runs from 10 m
 * to 158 m and the dog lets go at 157 m, the whole six-car train (15.6 m) on the level top.
 */
const thornwickGeometry: In<LiftSettings> = {
  profile: [
    { kind: "straight", length: 15, angle: 0 },
    { kind: "arc", radius: 40, toAngle: 20 },
    { kind: "straight", length: 25, angle: 20 },
    { kind: "arc", radius: 50, toAngle: 45 },
    { kind: "straight", length: 45, angle: 45 },
    { kind: "arc", radius: 25, toAngle: 0 },
    { kind: "straight", length: 20, angle: 0 },
    { kind: "arc", radius: 20, toAngle: -55 },
    { kind: "straight", length: 30, angle: -55 },
  ],
  chainFrom: 10,
  chainTo: 158,
  dogRelease: 157,
  bottomRun: 4,
};


/**
 * 315 kW four-pole induction motor (rated slip 1.5 %, breakdown 2.3: typical of the size, from memory) for the
 * taller, steeper climb; drive inertia at the chain ≈ 17 t (assumption, scaled from Emberline's 15.4 t).
 */
const thornwickDrive: In<DriveSettings> = {
  speed: 2.5,
  rampTime: 2,
  sprocketTeeth: 11,
  efficiency: 0.9,
  location: "bottom",
  motor: { kind: "induction", ratedPower: 315_000, ratedSlip: 0.015, breakdownRatio: 2.3, reflectedMass: 17_000 },
};
/** 6000 kg counterweight, friction ≈ 2 % of its weight (assumption); 3 m of travel for the longer loop. */
const thornwickTakeUp: In<TakeUpSettings> = { mass: 6000, travel: 3, position: 1.2, friction: 1200, damping: 0 };
const thornwickArd: In<AntiRollbackSettings> = { enabled: true, from: 12, to: 138, toothSpacing: 0.15 };

export const THORNWICK_LIFT: DemoLift = {
  key: "thornwick",
  name: "Thornwick two-slope lift",
  site: "East ridge, Lanternfell Park",
  notes: "Two-slope lift hill given as a profile: 20° kicker, 45° main incline, level top, first drop at −55°.",
  revisions: [
    {
      changeSummary: "As built (profile from the survey)",
      geometry: thornwickGeometry,
      // The Emberline lift's chain, sliding in the same plastic-lined trough.
      chain: EMBERLINE_CHAIN,
      drive: thornwickDrive,
      takeUp: thornwickTakeUp,
      antiRollback: thornwickArd,
    },
  ],
};

export const THORNWICK_SCENARIO: DemoScenario = {
  key: "thornwick-two-slope-drop",
  name: "Thornwick: two-slope lift with first drop",
  lift: "thornwick",
  revision: 1,
  train: "emberline-train",
  loading: "full",
  entrySpeed: 2.2,
  startPosition: 14,
  runSettings: { duration: 90, segments: 60 },
  notes:
    "A lift given as pieces: the chain takes the train up a 20° kicker and a 45° main incline, lets go on the level top, and the train runs into a first drop at −55°.",
  shows: "a lift given as a profile: the climb steepens from 20° to 45°, the dog lets go on the level top and the train gathers speed down the first drop",
  expect: [
    { field: "ardCatches", op: "==", value: 0, why: "no settling back onto the ARD" },
    { field: "minSafetyFactor", op: ">=", value: 5, why: "meets the default required safety factor of 5" },
    { field: "trainReachedEnd", op: "==", value: true, why: "the train goes over the top and down the first drop" },
    { field: "maxTrainSpeed", op: ">", value: 10, why: "the first drop (about 25 m) takes the train well beyond chain speed" },
  ],
};
