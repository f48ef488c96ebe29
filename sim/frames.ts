/**
 * Time series sampled on an even grid, and replay frames downsampled to a budget without losing the
 * exact frame of peak chain tension. Flat keys describe the lift and train 0 (as in version 1); `trains[j]`
 * holds every train's own signals.
 */
import type { LiftSystem } from "./rhs";

export const SERIES_KEYS = [
  "trainPosition",
  "trainSpeed",
  "dogForce",
  "driveTension",
  "takeUpPosition",
  "ardForce",
  "maxTension",
  "driveSpeed",
  "motorForce",
  "drivePower",
  "driveTorque",
] as const;
export type SeriesKey = (typeof SERIES_KEYS)[number];
/** Per-train series keys (front position, speed, dog force, ARD force), in `series.trains[j]`. */
export const TRAIN_SERIES_KEYS = ["position", "speed", "dogForce", "ardForce"] as const;
export type TrainSeriesKey = (typeof TRAIN_SERIES_KEYS)[number];
export type TrainSeries = Record<TrainSeriesKey, number[]>;
export type Series = { t: number[] } & Record<SeriesKey, number[]> & { trains: TrainSeries[] };

/** Values of one sample: the flat keys, then 4 per train. `drivePower` is the motor's input (÷ efficiency). */
export function seriesValues(sys: LiftSystem, Y: ArrayLike<number>, out: number[]): number[] {
  const L = sys.layout;
  out[0] = Y[L.iX];
  out[1] = Y[L.iV + L.iX];
  out[2] = sys.dogForce;
  out[3] = sys.driveTension;
  out[4] = Y[L.iY];
  out[5] = sys.ardForce;
  out[6] = sys.maxT;
  out[7] = sys.driveSpeed;
  out[8] = sys.driveForce;
  out[9] = sys.drivePower / sys.s.drive.efficiency;
  out[10] = sys.driveForce * sys.halfPitchDiameter;
  let o = SERIES_KEYS.length;
  for (let j = 0; j < sys.trains.length; j++) {
    const tr = sys.trains[j];
    out[o++] = Y[L.iX + j];
    out[o++] = Y[L.iV + L.iX + j];
    out[o++] = tr.dogForce;
    out[o++] = tr.ardForce;
  }
  return out;
}

/** Even samples every `interval` s; values between step ends are interpolated linearly. */
export class SeriesRecorder {
  readonly series: Series;
  private next = 0;
  private prevT = NaN;
  private prev: number[] = [];
  /** Every value array in the order seriesValues writes them. */
  private readonly columns: number[][];
  constructor(
    readonly interval: number,
    private readonly enabled: boolean,
    trains = 1,
  ) {
    const s = { t: [] as number[], trains: [] as TrainSeries[] } as unknown as Series;
    const columns: number[][] = [];
    for (const k of SERIES_KEYS) columns.push((s[k] = []));
    for (let j = 0; j < trains; j++) {
      const ts = {} as TrainSeries;
      for (const k of TRAIN_SERIES_KEYS) columns.push((ts[k] = []));
      s.trains.push(ts);
    }
    this.series = s;
    this.columns = columns;
  }

  /** A sample exactly at time t (used with dense output). */
  emit(t: number, vals: number[]): void {
    if (!this.enabled) return;
    this.series.t.push(t);
    for (let i = 0; i < this.columns.length; i++) this.columns[i].push(vals[i]);
    this.next = t + this.interval;
  }

  /** Next grid time still to emit. */
  get nextTime(): number {
    return this.next;
  }

  /** A step end: emit the grid times passed since the last one by interpolation. */
  stepEnd(t: number, vals: number[]): void {
    if (!this.enabled) return;
    if (this.prevT !== this.prevT) {
      if (t >= this.next) this.emit(t, vals);
    } else {
      while (this.next <= t + 1e-12) {
        const tt = this.next;
        const f = t > this.prevT ? (tt - this.prevT) / (t - this.prevT) : 1;
        this.series.t.push(tt);
        for (let i = 0; i < this.columns.length; i++) this.columns[i].push(this.prev[i] + (vals[i] - this.prev[i]) * f);
        this.next = tt + this.interval;
      }
    }
    this.prevT = t;
    for (let i = 0; i < vals.length; i++) this.prev[i] = vals[i];
  }
}

/** One train in a replay frame. */
export interface FrameTrain {
  /** Front position, m; speed, m/s. */
  position: number;
  speed: number;
  /** False before the train's startTime. */
  present: boolean;
  dogEngaged: boolean;
  dogForce: number;
  ardForce: number;
  /** Track position of the tooth under each pawl (null: none yet). */
  ardTeeth: (number | null)[];
  /** Index of the pawl carrying the ARD force, or null. */
  ardPawl: number | null;
}

export interface Frame {
  t: number;
  /** Tension of every segment, N (segment i joins station i to i+1 along the loop). */
  tensions: number[];
  /** Train 0 (all trains in `trains`). */
  trainPosition: number;
  trainSpeed: number;
  /** Take-up drop from its initial position, m (positive down). */
  takeUpPosition: number;
  /** Drive sprocket angle, rad in [0, 2π). */
  sprocketAngle: number;
  /** Chain travel through the drive since t = 0, m. */
  chainTravel: number;
  /** Chain speed at the drive, m/s. */
  driveSpeed: number;
  dogEngaged: boolean;
  dogForce: number;
  ardForce: number;
  /** Track position of the ARD tooth train 0's pawl would fall on, or null. */
  ardTooth: number | null;
  slackSegments: number;
  trains: FrameTrain[];
  /** True for the frame at the peak chain tension. */
  peak?: boolean;
  /** True for a frame kept at the step a train's pawl lands on the ARD (so a jump to the catch shows it). */
  ardCatch?: boolean;
}

/** At most this many ARD landings keep their own frame; a long settle-back bounces a few times, not hundreds. */
const MAX_CATCH_FRAMES = 24;

export class FrameRecorder {
  private frames: Frame[] = [];
  private next = 0;
  private readonly interval: number;
  private peakFrame: Frame | null = null;
  private peakValue = -1;
  private peakT = 0;
  // The peak is copied into preallocated storage as it rises; the frame object is built once at the end.
  private peakTensions: Float64Array;
  private peakY: Float64Array;
  private peakTrains: { dogForce: number; ardForce: number; active: boolean; tooth: Float64Array; ardPawl: number }[];
  private peakSlack = 0;
  private onArd: boolean[];
  private catchFrames = 0;
  private readonly radius: number;
  constructor(
    private readonly sys: LiftSystem,
    duration: number,
    private readonly budget: number,
  ) {
    this.interval = budget > 2 ? duration / (budget - 2) : duration;
    this.radius = sys.halfPitchDiameter;
    this.peakTensions = new Float64Array(sys.n);
    this.peakY = new Float64Array(sys.layout.size);
    this.peakTrains = sys.trains.map((tr) => ({ dogForce: 0, ardForce: 0, active: false, tooth: new Float64Array(tr.pawls.length), ardPawl: -1 }));
    this.onArd = sys.trains.map(() => false);
  }

  private build(
    t: number,
    Y: ArrayLike<number>,
    tensions: ArrayLike<number>,
    slack: number,
    trains: { dogForce: number; ardForce: number; active: boolean; tooth: ArrayLike<number>; ardPawl: number }[],
  ): Frame {
    const L = this.sys.layout;
    const travel = Y[L.iD];
    const ang = (((travel / this.radius) % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI);
    const ft: FrameTrain[] = trains.map((tr, j) => ({
      position: Y[L.iX + j],
      speed: Y[L.iV + L.iX + j],
      present: tr.active,
      dogEngaged: tr.dogForce > 0,
      dogForce: tr.dogForce,
      ardForce: tr.ardForce,
      ardTeeth: Array.from(tr.tooth, (v) => (v === v ? v : null)),
      ardPawl: tr.ardPawl >= 0 ? tr.ardPawl : null,
    }));
    const t0 = ft[0];
    return {
      t,
      tensions: Array.from(tensions),
      trainPosition: t0.position,
      trainSpeed: t0.speed,
      takeUpPosition: Y[L.iY],
      sprocketAngle: ang,
      chainTravel: travel,
      driveSpeed: Y[L.iV + L.iD],
      dogEngaged: t0.dogEngaged,
      dogForce: t0.dogForce,
      ardForce: t0.ardForce,
      ardTooth: t0.ardTeeth[t0.ardPawl ?? 0] ?? null,
      slackSegments: slack,
      trains: ft,
    };
  }

  /** After each step, with the system evaluated at (t, Y). */
  step(t: number, Y: Float64Array): void {
    if (this.budget <= 0) return;
    const sys = this.sys;
    let landed = false;
    sys.trains.forEach((tr, j) => {
      const on = tr.ardForce > 0;
      if (on && !this.onArd[j]) landed = true;
      this.onArd[j] = on;
    });
    if (landed && this.catchFrames < MAX_CATCH_FRAMES) {
      this.catchFrames++;
      this.frames.push({ ...this.build(t, Y, sys.T, sys.slack, sys.trains), ardCatch: true });
    } else if (t >= this.next) {
      this.frames.push(this.build(t, Y, sys.T, sys.slack, sys.trains));
      this.next = t + this.interval;
    }
    if (sys.maxT > this.peakValue) {
      this.peakValue = sys.maxT;
      this.peakT = t;
      this.peakTensions.set(sys.T);
      this.peakY.set(Y);
      this.peakSlack = sys.slack;
      sys.trains.forEach((tr, j) => {
        const p = this.peakTrains[j];
        p.dogForce = tr.dogForce;
        p.ardForce = tr.ardForce;
        p.active = tr.active;
        p.ardPawl = tr.ardPawl;
        p.tooth.set(tr.tooth);
      });
    }
  }

  private buildPeak(): Frame | null {
    if (this.peakValue < 0) return null;
    return this.build(this.peakT, this.peakY, this.peakTensions, this.peakSlack, this.peakTrains);
  }

  finish(): Frame[] {
    const out = this.frames.slice();
    this.peakFrame = this.buildPeak();
    if (this.peakFrame) {
      const p = { ...this.peakFrame, peak: true };
      const same = out.findIndex((f) => f.t === p.t);
      if (same >= 0) out[same] = p;
      else {
        const at = out.findIndex((f) => f.t > p.t);
        if (at < 0) out.push(p);
        else out.splice(at, 0, p);
      }
    }
    // Keep within the budget: drop regular frames evenly, never the peak frame or an ARD landing.
    if (out.length > this.budget) {
      const keep: Frame[] = [];
      const stride = out.length / this.budget;
      const chosen = new Set<number>();
      for (let i = 0; i < this.budget; i++) chosen.add(Math.floor(i * stride));
      const pinned = new Set<number>();
      out.forEach((f, i) => {
        if (f.peak || f.ardCatch) pinned.add(i);
      });
      for (const pi of pinned) {
        if (chosen.has(pi)) continue;
        let nearest = -1;
        for (const c of chosen) {
          if (pinned.has(c)) continue;
          if (nearest < 0 || Math.abs(c - pi) < Math.abs(nearest - pi)) nearest = c;
        }
        if (nearest >= 0) chosen.delete(nearest);
        chosen.add(pi);
      }
      [...chosen].sort((a, b) => a - b).forEach((i) => keep.push(out[i]));
      return keep;
    }
    return out;
  }
}
