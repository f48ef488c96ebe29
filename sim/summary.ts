/**
 * Summary figures of a run, accumulated step by step from the system's diagnostics.
 * Quantities that did not happen (no engagement, no steady climb) are null, never NaN.
 */
import type { LiftSystem } from "./rhs";

export interface Summary {
  peakTension: number;
  peakTensionTime: number;
  /** Loop position (m from the bottom idler, in the direction of travel) of the peak-tension segment's middle. */
  peakTensionLocation: number;
  peakDriveTension: number;
  steadyTension: number | null;
  snatchFactor: number | null;
  engagementTime: number | null;
  engagementSpeed: number | null;
  pickupDelay: number | null;
  peakDogForce: number;
  rollbackDistance: number;
  ardCatches: number;
  peakArdForce: number;
  takeUpMaxDrop: number;
  takeUpMaxRise: number;
  takeUpCreepRate: number | null;
  takeUpEndStop: boolean;
  slackSegments: number;
  peakDrivePower: number;
  peakDriveTorque: number;
  peakRiderAccel: number;
  minSafetyFactor: number;
  energyResidual: number | null;
  steps: number;
  rhsEvaluations: number;
  wallTimeMs: number;
  // Extras.
  simulatedTime: number;
  segments: number;
  integrator: string;
  timeStep: number | null;
  steadyClimbDuration: number;
  steadyDrivePower: number | null;
  dogClicks: number;
  dogReleaseTime: number | null;
  trainReachedEnd: boolean;
  maxTrainSpeed: number;
  /** Largest compression of the ARD contact, m (peak ARD force / contact stiffness): part of rollbackDistance. */
  peakArdCompression: number;
}

export interface StepView {
  t: number;
  x: number;
  vx: number;
  y: number;
  vy: number;
}

/** Rider acceleration is smoothed by a first-order low-pass with this time constant (s). */
export const RIDER_ACCEL_TIME_CONSTANT = 0.05;

/** Forward travel (m) the pawl must make off a tooth before landing on one again counts as an ARD catch. */
export const ARD_LIFT_OFF = 0.001;

export class SummaryRecorder {
  private sys: LiftSystem;
  peakTension = 0;
  peakTensionTime = 0;
  peakTensionSeg = 0;
  peakDriveTension = 0;
  engagementTime: number | null = null;
  engagementSpeed: number | null = null;
  pickupDelay: number | null = null;
  peakDogForce = 0;
  xMax: number;
  rollback = 0;
  ardCatches = 0;
  private ardOn = false;
  private xSinceArd = -Infinity;
  peakArdForce = 0;
  yMax = 0;
  yMin = 0;
  endStop = false;
  slackMax = 0;
  peakDrivePower = 0;
  peakDriveTorque = 0;
  private accelFiltered = 0;
  peakRiderAccel = 0;
  dogClicks = 0;
  dogReleaseTime: number | null = null;
  maxTrainSpeed = 0;
  // Steady climb accumulators: time-weighted mean drive tension, power, and least squares of y(t).
  private sw = 0;
  private sT = 0;
  private sP = 0;
  private st = 0;
  private sy = 0;
  private stt = 0;
  private sty = 0;
  private lastT = 0;
  private lastInSteady = false;
  private readonly rearLimit: number;
  private readonly frontLimit: number;
  private readonly vSteady: number;
  private readonly halfD: number;

  constructor(sys: LiftSystem) {
    this.sys = sys;
    this.xMax = NaN; // set by the first step (the train may start settled back on the ARD)
    this.rearLimit = sys.track.inclineStart;
    this.frontLimit = sys.track.crestStart;
    this.vSteady = 0.95 * sys.s.drive.speed;
    this.halfD = sys.s.chain.pitch / Math.sin(Math.PI / sys.s.drive.sprocketTeeth) / 2;
    this.maxTrainSpeed = sys.s.trains[0].entrySpeed;
  }

  /** Called after each accepted step, with the system evaluated at that state. */
  step(v: StepView, dt: number, events: number): void {
    const sys = this.sys;
    const t = v.t;
    if (sys.maxT > this.peakTension) {
      this.peakTension = sys.maxT;
      this.peakTensionTime = t;
      this.peakTensionSeg = sys.maxTSeg;
    }
    if (sys.driveTension > this.peakDriveTension) this.peakDriveTension = sys.driveTension;
    const dogF = sys.dogForce;
    if (dogF > 0 && this.engagementTime === null) {
      this.engagementTime = t;
      this.engagementSpeed = sys.dogDeltaRate;
    }
    if (this.engagementTime !== null && this.pickupDelay === null && dogF > 0) {
      if (dogF >= sys.train.resistingLoad(v.x, v.vx)) this.pickupDelay = t - this.engagementTime;
    }
    if (dogF > this.peakDogForce) this.peakDogForce = dogF;
    if (v.x > this.xMax || this.xMax !== this.xMax) this.xMax = v.x;
    if (this.xMax - v.x > this.rollback) this.rollback = this.xMax - v.x;
    // An ARD catch: the pawl comes back onto a tooth after the train had pulled at least
    // ARD_LIFT_OFF clear of where it now lands (light re-touches of a resting pawl do not count).
    const ard = sys.ardForce;
    if (ard > 0 && !this.ardOn && this.xSinceArd - v.x > ARD_LIFT_OFF) this.ardCatches++;
    if (ard > 0) this.xSinceArd = v.x;
    else if (v.x > this.xSinceArd) this.xSinceArd = v.x;
    this.ardOn = ard > 0;
    if (ard > this.peakArdForce) this.peakArdForce = ard;
    if (v.y > this.yMax) this.yMax = v.y;
    if (v.y < this.yMin) this.yMin = v.y;
    if (sys.stopForce !== 0) this.endStop = true;
    if (sys.slack > this.slackMax) this.slackMax = sys.slack;
    const eta = sys.s.drive.efficiency;
    const p = sys.drivePower / eta;
    if (p > this.peakDrivePower) this.peakDrivePower = p;
    const torque = sys.driveForce * this.halfD; // at the sprocket shaft
    if (torque > this.peakDriveTorque) this.peakDriveTorque = torque;
    const a = dt > 0 ? dt / (RIDER_ACCEL_TIME_CONSTANT + dt) : 0;
    this.accelFiltered += (sys.ax - this.accelFiltered) * a;
    const ra = Math.abs(this.accelFiltered) / sys.g;
    if (ra > this.peakRiderAccel) this.peakRiderAccel = ra;
    if (v.vx > this.maxTrainSpeed) this.maxTrainSpeed = v.vx;
    if (events & 2) this.dogClicks++;
    if (events & 8 && this.dogReleaseTime === null && v.x - sys.dogOffset >= sys.dogRelease) this.dogReleaseTime = t;

    // Steady climb: whole train on the straight incline, dog engaged, speed ≥ 95 % of chain speed.
    const inSteady =
      v.x - sys.train.length >= this.rearLimit &&
      v.x <= this.frontLimit &&
      dogF > 0 &&
      v.vx >= this.vSteady &&
      sys.drive.velocity(t) >= sys.s.drive.speed * 0.999;
    if (inSteady && this.lastInSteady) {
      const h = t - this.lastT;
      this.sw += h;
      this.sT += sys.driveTension * h;
      this.sP += p * h;
      this.st += t * h;
      this.sy += v.y * h;
      this.stt += t * t * h;
      this.sty += t * v.y * h;
    }
    this.lastInSteady = inSteady;
    this.lastT = t;
  }

  finish(extra: {
    steps: number;
    wallTimeMs: number;
    energyResidual: number | null;
    simulatedTime: number;
    integrator: string;
    timeStep: number | null;
    trainReachedEnd: boolean;
  }): Summary {
    const sys = this.sys;
    const steady = this.sw > 0.5 ? this.sT / this.sw : null;
    let creep: number | null = null;
    if (this.sw > 1) {
      const mt = this.st / this.sw;
      const my = this.sy / this.sw;
      const vt = this.stt / this.sw - mt * mt;
      if (vt > 0) creep = (this.sty / this.sw - mt * my) / vt;
    }
    const loop = sys.loop;
    return {
      peakTension: this.peakTension,
      peakTensionTime: this.peakTensionTime,
      peakTensionLocation: loop.q[this.peakTensionSeg] + loop.L[this.peakTensionSeg] / 2,
      peakDriveTension: this.peakDriveTension,
      steadyTension: steady,
      snatchFactor: steady && steady > 0 ? this.peakTension / steady : null,
      engagementTime: this.engagementTime,
      engagementSpeed: this.engagementSpeed,
      pickupDelay: this.pickupDelay,
      peakDogForce: this.peakDogForce,
      rollbackDistance: this.rollback,
      ardCatches: this.ardCatches,
      peakArdForce: this.peakArdForce,
      takeUpMaxDrop: this.yMax,
      takeUpMaxRise: -this.yMin,
      takeUpCreepRate: creep,
      takeUpEndStop: this.endStop,
      slackSegments: this.slackMax,
      peakDrivePower: this.peakDrivePower,
      peakDriveTorque: this.peakDriveTorque,
      peakRiderAccel: this.peakRiderAccel,
      minSafetyFactor: this.peakTension > 0 ? sys.s.chain.breakingStrength / this.peakTension : 1e9,
      energyResidual: extra.energyResidual,
      steps: extra.steps,
      rhsEvaluations: sys.evaluations,
      wallTimeMs: extra.wallTimeMs,
      simulatedTime: extra.simulatedTime,
      segments: loop.segments,
      integrator: extra.integrator,
      timeStep: extra.timeStep,
      steadyClimbDuration: this.sw,
      steadyDrivePower: this.sw > 0.5 ? this.sP / this.sw : null,
      dogClicks: this.dogClicks,
      dogReleaseTime: this.dogReleaseTime,
      trainReachedEnd: extra.trainReachedEnd,
      maxTrainSpeed: this.maxTrainSpeed,
      peakArdCompression: this.peakArdForce / sys.ardStiffness,
    };
  }
}
