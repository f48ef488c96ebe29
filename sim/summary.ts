/**
 * Summary figures of a run. Peaks and events are accumulated step by step from the system's diagnostics;
 * figures of the steady climb are taken afterwards from signals sampled every SAMPLE_INTERVAL and filtered
 * over whole periods of the surge (the train-on-chain oscillation), so they do not depend on where in a
 * swing the window happens to start or end. Quantities that did not happen are null, never NaN.
 */
import { releaseFigures, type ReleaseFigures } from "./release";
import { EVENT_CLICK, EVENT_ENGAGE, EVENT_RELEASE, type LiftSystem } from "./rhs";
import {
  averageOver,
  dampingRatioFromDecrement,
  dominantPeriod,
  fitTrendSinusoids,
  logDecrement,
  periodAverage,
  positivePeaks,
} from "./signal";
import { StopRecorder, type StopFigures } from "./stop";

/** Figures of one train (`summary.trains[i]`). */
export interface TrainSummary {
  engagementTime: number | null;
  engagementSpeed: number | null;
  pickupDelay: number | null;
  timeToChainSpeed: number | null;
  peakDogForce: number;
  rollbackDistance: number;
  ardCatches: number;
  ardBounces: number;
  peakArdForce: number;
  /** Largest compression of the ARD contact, m (peak ARD force / contact stiffness): part of rollbackDistance. */
  peakArdCompression: number;
  peakRiderAccel: number;
  riderAccelExposure: RiderAccelExposure;
  surgeAmplitude: number | null;
  surgeDampingRatio: number | null;
  surgePeriod: number | null;
  dogClicks: number;
  dogReleaseTime: number | null;
  maxTrainSpeed: number;
  /** The stop on the lift (drive.stop) as this train lived it; null without a stop or when the chain did not carry it then. */
  stop: StopFigures | null;
  /** The dog's release at lift.dogRelease: speed, kinetic energy against the energy to clear the crest, re-engagement. */
  release: ReleaseFigures | null;
}

/**
 * Longest continuous time (s) the filtered rider acceleration stayed above each level, by direction:
 * `forward` while the train speeds up (rider pressed into the seat back), `backward` while it slows
 * (rider pitched forward). Entry k is the level (k + 1)·RIDER_ACCEL_LEVEL_STEP g.
 */
export interface RiderAccelExposure {
  forward: number[];
  backward: number[];
  /** Largest filtered acceleration in each direction, g. */
  forwardPeak: number;
  backwardPeak: number;
}

/** The lift as a whole: the per-train keys hold peaks over all trains, counts summed, times of the first. */
export interface Summary extends TrainSummary {
  peakTension: number;
  peakTensionTime: number;
  /** Loop position (m from the bottom idler, in the direction of travel) of the peak-tension segment's middle. */
  peakTensionLocation: number;
  peakDriveTension: number;
  steadyTension: number | null;
  snatchFactor: number | null;
  steadyChainSpeed: number | null;
  takeUpMaxDrop: number;
  takeUpMaxRise: number;
  takeUpCreepRate: number | null;
  takeUpEndStop: boolean;
  slackSegments: number;
  peakDrivePower: number;
  peakDriveTorque: number;
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
  trainReachedEnd: boolean;
  /** The stop on the lift for the first train the chain carried then (see trains[i].stop for each). */
  stop: StopFigures | null;
  /** The first train's release at lift.dogRelease (see trains[i].release for each). */
  release: ReleaseFigures | null;
  /** Per-train figures. */
  trains: TrainSummary[];
}

/** Plain-words definitions of the summary figures, for tooltips, reports and the README. */
export const SUMMARY_DEFINITIONS = {
  peakTension: "Highest tension in any chain segment during the run.",
  peakDriveTension: "Highest tight-side tension arriving at the drive sprocket during the run.",
  steadyTension:
    "Drive tension averaged over whole surge periods of the steady climb (whole train on the straight incline, carried by the dog at chain speed, the drive asked for full speed).",
  snatchFactor: "Peak drive tension / steady drive tension (both at the drive, so the chain's own weight does not inflate it).",
  steadyChainSpeed: "Mean chain speed at the drive over the steady climb (below the set speed by the motor's slip).",
  surgeAmplitude:
    "Half the peak-to-peak swing of the train's speed about its mean filtered over one surge period, over the steady climb (m/s).",
  surgeDampingRatio:
    "Damping ratio of the surge after pick-up, from the logarithmic decrement of its successive peaks: ζ = δ/√(4π² + δ²). Negative when the surge grew; empty when fewer than three peaks could be measured.",
  surgePeriod: "Period of the surge (train-on-chain oscillation) over the steady climb.",
  engagementTime: "Time of the first dog contact with a catch point.",
  engagementSpeed: "Catch-point speed minus train speed at the first dog contact.",
  pickupDelay:
    "Load pick-up delay: first dog contact → first moment the dog force reaches the train's resisting load (weight component + rolling resistance + drag). 0 when the catch happens where the load is already carried, e.g. on the flat.",
  timeToChainSpeed:
    "Time to chain speed: first dog contact → the train's speed within 5 % of the chain speed at the drive, after which it no longer settles back onto the ARD (a surge about chain speed afterwards is reported as the surge amplitude).",
  peakDogForce: "Highest force between the dog and a catch point.",
  rollbackDistance: "Largest backward travel of the train from its furthest position.",
  ardCatches: "Times the pawl came down on the ARD: on a new tooth, or after at least 0.25 s off the pawl.",
  ardBounces: "Re-touches of the same tooth within 0.25 s of leaving it (bounces of a catch, counted apart).",
  takeUpMaxDrop: "Largest drop of the counterweight below its starting position.",
  takeUpMaxRise: "Largest rise of the counterweight above its starting position.",
  takeUpCreepRate:
    "Rate of the counterweight's drop over the steady climb: its position averaged over one surge period, then a least-squares trend (plus a sinusoid at the surge period). Negative while it rises: the loaded length shrinks as the train climbs, so the weight rises at about F·v/(2·E·A).",
  peakRiderAccel: "Largest longitudinal acceleration of the train, in g, after a first-order low-pass of 0.05 s.",
  riderAccelExposure: "Longest continuous time the filtered rider acceleration stayed above each level, forward and backward.",
  minSafetyFactor: "Breaking strength / peak tension.",
  steadyClimbDuration: "Length of the steady climb used for the steady figures, s.",
  release:
    "The dog's release at lift.dogRelease: the train's speed and kinetic energy then, against the energy to carry it to its highest point ahead (rise of its weight + rolling resistance); the margin is their ratio. A re-engagement after the release (the train fell back onto the chain) is reported with its time.",
  stop:
    "The stop on the lift: the train's speed v, mass m and load F at the stop, the stiffness k holding it (chain from the dog to the drive with the dog contact), and the inequality that decides a settle-back: v·√(k·m) > F unloads the dog and the train rolls back onto the ARD; then the peak ARD force, the rollback and the time from the restart until the dog carries the train again.",
} as const satisfies Partial<Record<keyof Summary, string>>;

export interface StepView {
  t: number;
  /** Train 0's front position and speed, the take-up's drop and its rate. */
  x: number;
  vx: number;
  y: number;
  vy: number;
  /** The whole state vector (LiftSystem.layout): every train's position and speed. */
  Y?: ArrayLike<number>;
}

/** Rider acceleration is smoothed by a first-order low-pass with this time constant (s). */
export const RIDER_ACCEL_TIME_CONSTANT = 0.05;
/** Levels of the rider-acceleration exposure: every RIDER_ACCEL_LEVEL_STEP g up to RIDER_ACCEL_LEVELS of them. */
export const RIDER_ACCEL_LEVEL_STEP = 0.05;
export const RIDER_ACCEL_LEVELS = 40;

/** Forward travel (m) the pawl must make off a tooth before landing on one again counts as a landing at all. */
export const ARD_LIFT_OFF = 0.001;
/** A landing on the same tooth after at least this long off the pawl is a new catch; sooner it is a bounce. */
export const ARD_CATCH_MIN_OFF_TIME = 0.25;
/** Spacing of the signals kept for the steady-climb figures, s. */
export const SAMPLE_INTERVAL = 0.01;
/** "At chain speed": within this fraction of the drive's chain speed. */
export const CHAIN_SPEED_BAND = 0.05;

/** Longest continuous time above each level, updated step by step. */
class ExposureRecorder {
  private readonly start: number[] = new Array(RIDER_ACCEL_LEVELS).fill(NaN);
  readonly longest: number[] = new Array(RIDER_ACCEL_LEVELS).fill(0);
  private on = 0; // levels currently exceeded (the lowest `on` of them)

  step(t: number, a: number): void {
    const nOn = Math.min(RIDER_ACCEL_LEVELS, Math.max(0, Math.floor(a / RIDER_ACCEL_LEVEL_STEP + 1e-12)));
    if (nOn === this.on) return; // nothing opens or closes (most steps)
    const hi = Math.max(nOn, this.on);
    for (let k = 0; k < hi; k++) {
      if (k < nOn) {
        if (this.start[k] !== this.start[k]) this.start[k] = t;
      } else if (this.start[k] === this.start[k]) {
        this.longest[k] = Math.max(this.longest[k], t - this.start[k]);
        this.start[k] = NaN;
      }
    }
    this.on = nOn;
  }

  finish(t: number): number[] {
    for (let k = 0; k < RIDER_ACCEL_LEVELS; k++)
      if (this.start[k] === this.start[k]) this.longest[k] = Math.max(this.longest[k], t - this.start[k]);
    return this.longest.map((v) => Number(v.toFixed(4)));
  }
}

/** Samples of the signals the steady-climb figures are taken from (per train: NaN before it appears). */
interface Samples {
  t: number[];
  /** Chain speed at the drive, and the speed the drive is asked for (ramp, stops). */
  vd: number[];
  vref: number[];
  driveTension: number[];
  power: number[];
  y: number[];
  trains: { x: number[]; v: number[]; dog: boolean[]; ard: boolean[] }[];
}

/** What a train recorder needs of its train that does not change along a run. */
export interface TrainContext {
  g: number;
  dogOffset: number;
  dogRelease: number;
  resistingLoad(x: number, v: number): number;
}

/** A train's contact forces and events after a step. */
export interface TrainContacts {
  dogForce: number;
  dogDeltaRate: number;
  ardForce: number;
  /** Tooth under the pawl carrying the ARD force (or the first pawl). */
  tooth: number;
  ax: number;
  events: number;
}

/** Step-by-step figures of one train (exported for its tests). */
export class TrainRecorder {
  engagementTime: number | null = null;
  engagementSpeed: number | null = null;
  pickupDelay: number | null = null;
  peakDogForce = 0;
  xMax = NaN; // set by the first step (the train may start settled back on the ARD)
  rollback = 0;
  ardCatches = 0;
  ardBounces = 0;
  lastArdCatchTime: number | null = null;
  private first = true;
  private ardOn = false;
  private xSinceArd = -Infinity;
  private lastTooth = NaN;
  private ardOffSince = 0;
  peakArdForce = 0;
  private accelFiltered = 0;
  peakRiderAccel = 0;
  private readonly fwd = new ExposureRecorder();
  private readonly bwd = new ExposureRecorder();
  private fwdPeak = 0;
  private bwdPeak = 0;
  dogClicks = 0;
  dogReleaseTime: number | null = null;
  maxTrainSpeed: number;

  constructor(
    entrySpeed: number,
    private readonly ctx: TrainContext,
  ) {
    this.maxTrainSpeed = entrySpeed;
  }

  step(t: number, x: number, vx: number, dt: number, c: TrainContacts): void {
    const dogF = c.dogForce;
    if (dogF > 0 && this.engagementTime === null) {
      this.engagementTime = t;
      this.engagementSpeed = c.dogDeltaRate;
    }
    if (this.engagementTime !== null && this.pickupDelay === null && dogF > 0) {
      if (dogF >= this.ctx.resistingLoad(x, vx)) this.pickupDelay = t - this.engagementTime;
    }
    if (dogF > this.peakDogForce) this.peakDogForce = dogF;
    if (x > this.xMax || this.xMax !== this.xMax) this.xMax = x;
    if (this.xMax - x > this.rollback) this.rollback = this.xMax - x;
    // The pawl comes down on a tooth after the train had pulled at least ARD_LIFT_OFF clear of where it now
    // lands (light re-touches of a resting pawl are not landings). A landing on a new tooth, or after
    // ARD_CATCH_MIN_OFF_TIME off the pawl, is a catch; a quicker re-touch of the same tooth is a bounce.
    // A train that starts resting on the ARD has not been caught.
    const ard = c.ardForce;
    if (this.first) {
      if (ard > 0) this.lastTooth = c.tooth;
    } else if (ard > 0 && !this.ardOn && this.xSinceArd - x > ARD_LIFT_OFF) {
      if (c.tooth !== this.lastTooth || t - this.ardOffSince >= ARD_CATCH_MIN_OFF_TIME) {
        this.ardCatches++;
        this.lastArdCatchTime = t;
      } else this.ardBounces++;
      this.lastTooth = c.tooth;
    }
    if (ard > 0) this.xSinceArd = x;
    else if (x > this.xSinceArd) this.xSinceArd = x;
    if (ard <= 0 && this.ardOn) this.ardOffSince = t;
    this.ardOn = ard > 0;
    this.first = false;
    if (ard > this.peakArdForce) this.peakArdForce = ard;
    const a = dt > 0 ? dt / (RIDER_ACCEL_TIME_CONSTANT + dt) : 0;
    this.accelFiltered += (c.ax - this.accelFiltered) * a;
    const g = this.accelFiltered / this.ctx.g;
    if (Math.abs(g) > this.peakRiderAccel) this.peakRiderAccel = Math.abs(g);
    this.fwd.step(t, g);
    this.bwd.step(t, -g);
    if (g > this.fwdPeak) this.fwdPeak = g;
    if (-g > this.bwdPeak) this.bwdPeak = -g;
    if (vx > this.maxTrainSpeed) this.maxTrainSpeed = vx;
    if (c.events & EVENT_CLICK) this.dogClicks++;
    if (c.events & EVENT_RELEASE && this.dogReleaseTime === null && x - this.ctx.dogOffset >= this.ctx.dogRelease) this.dogReleaseTime = t;
  }

  exposure(t: number): RiderAccelExposure {
    return { forward: this.fwd.finish(t), backward: this.bwd.finish(t), forwardPeak: this.fwdPeak, backwardPeak: this.bwdPeak };
  }
}

/** Indices [i0, i1] of the longest run of consecutive samples for which `ok` holds; null when none. */
function longestRun(n: number, ok: (i: number) => boolean): [number, number] | null {
  let best: [number, number] | null = null;
  let start = -1;
  for (let i = 0; i <= n; i++) {
    if (i < n && ok(i)) {
      if (start < 0) start = i;
    } else if (start >= 0) {
      if (!best || i - 1 - start > best[1] - best[0]) best = [start, i - 1];
      start = -1;
    }
  }
  return best;
}

const slice = <T>(a: T[], i0: number, i1: number) => a.slice(i0, i1 + 1);

/**
 * Time to chain speed: first contact → first sample, after the last ARD catch, with the train speed within
 * CHAIN_SPEED_BAND of the drive's chain speed. Null when it never gets there.
 */
export function timeToChainSpeed(
  s: { t: ArrayLike<number>; v: ArrayLike<number>; vd: ArrayLike<number> },
  engagementTime: number | null,
  lastArdCatchTime: number | null,
): number | null {
  if (engagementTime === null) return null;
  const from = Math.max(engagementTime, lastArdCatchTime ?? -Infinity);
  for (let i = 0; i < s.t.length; i++) {
    if (s.t[i] < from || !(s.vd[i] > 0)) continue;
    if (Math.abs(s.v[i] - s.vd[i]) <= CHAIN_SPEED_BAND * s.vd[i]) return Math.max(0, s.t[i] - engagementTime);
  }
  return null;
}

export interface SurgeFigures {
  period: number | null;
  amplitude: number | null;
  dampingRatio: number | null;
}

/**
 * The surge of the train's speed about its mean: its period over the steady climb [i0, i1] (or, when that is
 * too short, over the carried climb from `carriedFrom`), its amplitude
 * there (half peak-to-peak about the speed averaged over one period), and the damping ratio from the
 * logarithmic decrement of its successive peaks from `from` (the first contact) to the end of the climb.
 */
export function surgeFigures(
  t: number[],
  v: number[],
  i0: number,
  i1: number,
  carriedFrom: number,
  from: number,
  chainSpeed: number,
): SurgeFigures {
  // A train that appears later has no speed before then: work from its first sample.
  let k0 = 0;
  while (k0 < i0 && !Number.isFinite(v[k0])) k0++;
  if (k0 > 0) return surgeFigures(t.slice(k0), v.slice(k0), i0 - k0, i1 - k0, carriedFrom, from, chainSpeed);
  const tw = slice(t, i0, i1);
  const vw = slice(v, i0, i1);
  // The period over the steady climb (the mode stiffens as the loaded length shrinks, so this is the one its
  // averages need); on a climb too short for two cycles, from the whole carried climb before it.
  let j0 = i0;
  while (j0 > 0 && t[j0 - 1] >= carriedFrom) j0--;
  const period = dominantPeriod(tw, vw) ?? dominantPeriod(slice(t, j0, i1), slice(v, j0, i1));
  let amplitude: number | null = null;
  let dampingRatio: number | null = null;
  if (period !== null && period < tw[tw.length - 1] - tw[0]) {
    const mean = periodAverage(t, v, period);
    let lo = Infinity;
    let hi = -Infinity;
    for (let i = i0; i <= i1; i++) {
      if (mean[i] !== mean[i]) continue;
      const r = v[i] - mean[i];
      lo = Math.min(lo, r);
      hi = Math.max(hi, r);
    }
    if (hi >= lo) amplitude = (hi - lo) / 2;
    // Decay: peaks of the speed about its filtered mean from the pick-up to the end of the climb.
    const td: number[] = [];
    const rd: number[] = [];
    for (let i = 0; i <= i1; i++) {
      if (t[i] < from || mean[i] !== mean[i]) continue;
      td.push(t[i]);
      rd.push(v[i] - mean[i]);
    }
    let big = 0;
    for (const r of rd) big = Math.max(big, Math.abs(r));
    const peaks = positivePeaks(td, rd, 0.1 * big).map((p) => p.value);
    // Nothing to measure below 0.5 % of chain speed (numerical ripple, not a surge).
    if (peaks.length >= 3 && peaks[0] > 0.005 * chainSpeed) {
      const delta = logDecrement(peaks);
      if (delta !== null) dampingRatio = dampingRatioFromDecrement(delta);
    }
  } else {
    let lo = Infinity;
    let hi = -Infinity;
    for (const x of vw) {
      lo = Math.min(lo, x);
      hi = Math.max(hi, x);
    }
    if (vw.length > 1) amplitude = (hi - lo) / 2;
  }
  return { period, amplitude, dampingRatio };
}

/**
 * Rate of the counterweight's drop over the steady climb [i0, i1]: y is averaged over one surge period P (and
 * again over its own ringing period when that differs), which removes the swings, and a trend plus a
 * sinusoid at P is fitted by least squares to what is left, inside the climb. Needs two whole periods;
 * without a surge, the straight line through the climb (at least 1 s of it).
 */
export function creepRate(t: number[], y: number[], i0: number, i1: number, P: number | null): number | null {
  const span = t[i1] - t[i0];
  if (P === null) {
    if (span < 1) return null;
    return fitTrendSinusoids(slice(t, i0, i1), slice(y, i0, i1))?.slope ?? null;
  }
  if (span < 2 * P) return null;
  let filtered = periodAverage(t, y, P);
  let reach = P / 2;
  const tw0 = slice(t, i0, i1);
  const Py = dominantPeriod(tw0, slice(y, i0, i1));
  if (Py !== null && Math.abs(Py - P) > 0.15 * P && Py < span / 3) {
    filtered = periodAverage(t, filtered.map((v, i) => (v === v ? v : y[i])), Py);
    reach += Py / 2;
  }
  const tw: number[] = [];
  const yw: number[] = [];
  for (let i = i0; i <= i1; i++) {
    if (t[i] < t[i0] + reach || t[i] > t[i1] - reach || filtered[i] !== filtered[i]) continue;
    tw.push(t[i]);
    yw.push(filtered[i]);
  }
  if (tw.length < 10 || tw[tw.length - 1] - tw[0] < P) return null;
  return fitTrendSinusoids(tw, yw, [P])?.slope ?? null;
}

export class SummaryRecorder {
  private sys: LiftSystem;
  peakTension = 0;
  peakTensionTime = 0;
  peakTensionSeg = 0;
  peakDriveTension = 0;
  yMax = 0;
  yMin = 0;
  endStop = false;
  slackMax = 0;
  peakDrivePower = 0;
  peakDriveTorque = 0;
  private readonly trains: TrainRecorder[];
  private readonly stops: StopRecorder[];
  private readonly releases: (ReleaseFigures | null)[];
  private readonly samples: Samples;
  private nextSample = 0;
  private readonly halfD: number;
  private readonly contacts: TrainContacts = { dogForce: 0, dogDeltaRate: 0, ardForce: 0, tooth: NaN, ax: 0, events: 0 };

  constructor(sys: LiftSystem) {
    this.sys = sys;
    this.halfD = sys.s.chain.pitch / Math.sin(Math.PI / sys.s.drive.sprocketTeeth) / 2;
    this.trains = sys.trains.map(
      (tr) =>
        new TrainRecorder(tr.settings.entrySpeed, {
          g: sys.g,
          dogOffset: tr.dogOffset,
          dogRelease: sys.dogRelease,
          resistingLoad: (x, v) => tr.model.resistingLoad(x, v),
        }),
    );
    this.stops = sys.trains.map((tr) => new StopRecorder(sys, tr));
    this.releases = sys.trains.map(() => null);
    this.samples = { t: [], vd: [], vref: [], driveTension: [], power: [], y: [], trains: sys.trains.map(() => ({ x: [], v: [], dog: [], ard: [] })) };
  }

  /** Front position and speed of train j at this step. */
  private trainAt(v: StepView, j: number): [number, number] {
    if (!v.Y) return [v.x, v.vx];
    const L = this.sys.layout;
    return [v.Y[L.iX + j], v.Y[L.iV + L.iX + j]];
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
    const c = this.contacts;
    for (let j = 0; j < this.trains.length; j++) {
      const st = sys.trains[j];
      if (!st.active) continue;
      const [x, vx] = this.trainAt(v, j);
      c.dogForce = st.dogForce;
      c.dogDeltaRate = st.dogDeltaRate;
      c.ardForce = st.ardForce;
      c.tooth = st.tooth[st.ardPawl >= 0 ? st.ardPawl : 0];
      c.ax = st.ax;
      c.events = this.trains.length === 1 ? events : st.events;
      this.trains[j].step(t, x, vx, dt, c);
      this.stops[j].step(t, x, vx, this.trains[j].ardCatches);
      const rel = this.releases[j];
      // The release: the dog passes lift.dogRelease (in contact or not, the chain carries it no further).
      if (!rel && x - st.dogOffset >= sys.dogRelease && st.settings.startPosition - st.dogOffset < sys.dogRelease)
        this.releases[j] = releaseFigures(st.model, st.settings.rollingResistance, sys.g, sys.track.length, t, x, vx);
      else if (rel && rel.reengagedAt === null && c.events & EVENT_ENGAGE) rel.reengagedAt = t;
    }
    if (v.y > this.yMax) this.yMax = v.y;
    if (v.y < this.yMin) this.yMin = v.y;
    if (sys.stopForce !== 0) this.endStop = true;
    if (sys.slack > this.slackMax) this.slackMax = sys.slack;
    const p = sys.drivePower / sys.s.drive.efficiency;
    if (p > this.peakDrivePower) this.peakDrivePower = p;
    const torque = sys.driveForce * this.halfD; // at the sprocket shaft
    if (torque > this.peakDriveTorque) this.peakDriveTorque = torque;
    if (t >= this.nextSample) {
      const s = this.samples;
      s.t.push(t);
      s.vd.push(sys.driveSpeed);
      s.vref.push(sys.drive.velocity(t));
      s.driveTension.push(sys.driveTension);
      s.power.push(p);
      s.y.push(v.y);
      for (let j = 0; j < s.trains.length; j++) {
        const st = sys.trains[j];
        const [x, vx] = st.active ? this.trainAt(v, j) : [NaN, NaN];
        const tj = s.trains[j];
        tj.x.push(x);
        tj.v.push(vx);
        tj.dog.push(st.dogForce > 0);
        tj.ard.push(st.ardForce > 0);
      }
      this.nextSample = (Math.floor(t / SAMPLE_INTERVAL + 1e-9) + 1) * SAMPLE_INTERVAL;
    }
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
    const s = this.samples;
    const n = s.t.length;
    const V = sys.s.drive.speed;
    const rear = sys.track.inclineStart;
    const crest = sys.track.crestStart;

    // Steady climb of train j: the longest stretch with the whole train on the straight incline, carried (at
    // chain speed once, never back on the ARD since, the dog in contact within the last half second: a surge
    // may lift it off briefly) and the drive asked for full speed.
    const steadyOf = (j: number, carriedFrom: number): [number, number] | null => {
      const tj = s.trains[j];
      const length = sys.trains[j].model.length;
      let lastDog = -Infinity;
      const dogRecent = s.t.map((ti, i) => {
        if (tj.dog[i]) lastDog = ti;
        return ti - lastDog <= 0.5;
      });
      return longestRun(
        n,
        (i) =>
          s.t[i] >= carriedFrom &&
          tj.x[i] - length >= rear &&
          tj.x[i] <= crest &&
          dogRecent[i] &&
          !tj.ard[i] &&
          s.vref[i] >= V * 0.999,
      );
    };

    const steadyRuns: ([number, number] | null)[] = [];
    const trains: TrainSummary[] = this.trains.map((tr, j) => {
      const tj = s.trains[j];
      const tcs = timeToChainSpeed({ t: s.t, v: tj.v, vd: s.vd }, tr.engagementTime, tr.lastArdCatchTime);
      const carriedFrom = tr.engagementTime !== null && tcs !== null ? tr.engagementTime + tcs : Infinity;
      const run = steadyOf(j, carriedFrom);
      steadyRuns.push(run);
      const surge = run ? surgeFigures(s.t, tj.v, run[0], run[1], carriedFrom, tr.engagementTime ?? s.t[run[0]], V) : null;
      return {
        engagementTime: tr.engagementTime,
        engagementSpeed: tr.engagementSpeed,
        pickupDelay: tr.pickupDelay,
        timeToChainSpeed: tcs,
        peakDogForce: tr.peakDogForce,
        rollbackDistance: tr.rollback,
        ardCatches: tr.ardCatches,
        ardBounces: tr.ardBounces,
        peakArdForce: tr.peakArdForce,
        peakArdCompression: tr.peakArdForce / sys.ardStiffness,
        peakRiderAccel: tr.peakRiderAccel,
        riderAccelExposure: tr.exposure(extra.simulatedTime),
        surgeAmplitude: surge?.amplitude ?? null,
        surgeDampingRatio: surge?.dampingRatio ?? null,
        surgePeriod: surge?.period ?? null,
        dogClicks: tr.dogClicks,
        dogReleaseTime: tr.dogReleaseTime,
        maxTrainSpeed: tr.maxTrainSpeed,
        stop: this.stops[j].figures,
        release: this.releases[j],
      };
    });

    // The lift's steady figures come from the first train's steady climb.
    const first = trains[0];
    const run = steadyRuns[0];
    let steadyTension: number | null = null;
    let steadyPower: number | null = null;
    let steadyChainSpeed: number | null = null;
    let creep: number | null = null;
    let steadyDuration = 0;
    if (run) {
      const [i0, i1] = run;
      steadyDuration = s.t[i1] - s.t[i0];
      // Average over whole surge periods (centred in the climb), or the whole climb when there is no surge.
      const P = first.surgePeriod;
      let a = s.t[i0];
      let b = s.t[i1];
      if (P !== null && P <= b - a) {
        const k = Math.floor((b - a) / P + 1e-9);
        const spare = b - a - k * P;
        a += spare / 2;
        b = a + k * P;
      }
      if (steadyDuration > 0.5) {
        steadyTension = averageOver(s.t, s.driveTension, a, b);
        steadyPower = averageOver(s.t, s.power, a, b);
        steadyChainSpeed = averageOver(s.t, s.vd, a, b);
      }
      creep = creepRate(s.t, s.y, i0, i1, P);
    }

    const loop = sys.loop;
    const maxOf = (f: (t: TrainSummary) => number) => Math.max(...trains.map(f));
    const sumOf = (f: (t: TrainSummary) => number) => trains.reduce((acc, t) => acc + f(t), 0);
    const exposure: RiderAccelExposure = {
      forward: first.riderAccelExposure.forward.map((_, k) => maxOf((t) => t.riderAccelExposure.forward[k])),
      backward: first.riderAccelExposure.backward.map((_, k) => maxOf((t) => t.riderAccelExposure.backward[k])),
      forwardPeak: maxOf((t) => t.riderAccelExposure.forwardPeak),
      backwardPeak: maxOf((t) => t.riderAccelExposure.backwardPeak),
    };
    return {
      peakTension: this.peakTension,
      peakTensionTime: this.peakTensionTime,
      peakTensionLocation: loop.q[this.peakTensionSeg] + loop.L[this.peakTensionSeg] / 2,
      peakDriveTension: this.peakDriveTension,
      steadyTension,
      snatchFactor: steadyTension && steadyTension > 0 ? this.peakDriveTension / steadyTension : null,
      steadyChainSpeed,
      surgeAmplitude: first.surgeAmplitude,
      surgeDampingRatio: first.surgeDampingRatio,
      surgePeriod: first.surgePeriod,
      engagementTime: first.engagementTime,
      engagementSpeed: first.engagementSpeed,
      pickupDelay: first.pickupDelay,
      timeToChainSpeed: first.timeToChainSpeed,
      peakDogForce: maxOf((t) => t.peakDogForce),
      rollbackDistance: maxOf((t) => t.rollbackDistance),
      ardCatches: sumOf((t) => t.ardCatches),
      ardBounces: sumOf((t) => t.ardBounces),
      peakArdForce: maxOf((t) => t.peakArdForce),
      takeUpMaxDrop: this.yMax,
      takeUpMaxRise: -this.yMin,
      takeUpCreepRate: creep,
      takeUpEndStop: this.endStop,
      slackSegments: this.slackMax,
      peakDrivePower: this.peakDrivePower,
      peakDriveTorque: this.peakDriveTorque,
      peakRiderAccel: maxOf((t) => t.peakRiderAccel),
      riderAccelExposure: exposure,
      minSafetyFactor: this.peakTension > 0 ? sys.s.chain.breakingStrength / this.peakTension : 1e9,
      energyResidual: extra.energyResidual,
      steps: extra.steps,
      rhsEvaluations: sys.evaluations,
      wallTimeMs: extra.wallTimeMs,
      simulatedTime: extra.simulatedTime,
      segments: loop.segments,
      integrator: extra.integrator,
      timeStep: extra.timeStep,
      steadyClimbDuration: steadyDuration,
      steadyDrivePower: steadyPower,
      dogClicks: sumOf((t) => t.dogClicks),
      dogReleaseTime: first.dogReleaseTime,
      trainReachedEnd: extra.trainReachedEnd,
      maxTrainSpeed: maxOf((t) => t.maxTrainSpeed),
      peakArdCompression: maxOf((t) => t.peakArdCompression),
      stop: trains.find((t) => t.stop !== null)?.stop ?? null,
      release: first.release,
      trains,
    };
  }
}
