/**
 * Time series sampled on an even grid, and replay frames downsampled to a budget without losing the
 * exact frame of peak chain tension.
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
] as const;
export type SeriesKey = (typeof SERIES_KEYS)[number];
export type Series = { t: number[] } & Record<SeriesKey, number[]>;

export function seriesValues(sys: LiftSystem, x: number, vx: number, y: number, out: number[]): number[] {
  out[0] = x;
  out[1] = vx;
  out[2] = sys.dogForce;
  out[3] = sys.driveTension;
  out[4] = y;
  out[5] = sys.ardForce;
  out[6] = sys.maxT;
  return out;
}

/** Even samples every `interval` s; values between step ends are interpolated linearly. */
export class SeriesRecorder {
  readonly series: Series;
  private next = 0;
  private prevT = NaN;
  private prev: number[] = [];
  constructor(
    readonly interval: number,
    private readonly enabled: boolean,
  ) {
    const s = { t: [] as number[] } as Series;
    for (const k of SERIES_KEYS) s[k] = [];
    this.series = s;
  }

  /** A sample exactly at time t (used with dense output). */
  emit(t: number, vals: number[]): void {
    if (!this.enabled) return;
    this.series.t.push(t);
    for (let i = 0; i < SERIES_KEYS.length; i++) this.series[SERIES_KEYS[i]].push(vals[i]);
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
        for (let i = 0; i < SERIES_KEYS.length; i++) {
          this.series[SERIES_KEYS[i]].push(this.prev[i] + (vals[i] - this.prev[i]) * f);
        }
        this.next = tt + this.interval;
      }
    }
    this.prevT = t;
    for (let i = 0; i < vals.length; i++) this.prev[i] = vals[i];
  }
}

export interface Frame {
  t: number;
  /** Tension of every segment, N (segment i joins station i to i+1 along the loop). */
  tensions: number[];
  trainPosition: number;
  trainSpeed: number;
  /** Take-up drop from its initial position, m (positive down). */
  takeUpPosition: number;
  /** Drive sprocket angle, rad in [0, 2π). */
  sprocketAngle: number;
  /** Chain travel through the drive since t = 0, m. */
  chainTravel: number;
  dogEngaged: boolean;
  dogForce: number;
  ardForce: number;
  /** Track position of the ARD tooth the pawl would fall on, or null. */
  ardTooth: number | null;
  slackSegments: number;
  /** True for the frame at the peak chain tension. */
  peak?: boolean;
}

export class FrameRecorder {
  private frames: Frame[] = [];
  private next = 0;
  private readonly interval: number;
  private peakFrame: Frame | null = null;
  private peakValue = -1;
  // The peak is copied into preallocated storage as it rises; the frame object is built once at the end.
  private peakTensions: Float64Array;
  private peakScalars = new Float64Array(8);
  private readonly radius: number;
  constructor(
    private readonly sys: LiftSystem,
    duration: number,
    private readonly budget: number,
  ) {
    this.interval = budget > 2 ? duration / (budget - 2) : duration;
    this.radius = sys.s.chain.pitch / Math.sin(Math.PI / sys.s.drive.sprocketTeeth) / 2;
    this.peakTensions = new Float64Array(sys.n);
  }

  private snapshot(t: number, x: number, vx: number, y: number): Frame {
    const sys = this.sys;
    const travel = sys.drive.displacement(t);
    const ang = (travel / this.radius) % (2 * Math.PI);
    return {
      t,
      tensions: Array.from(sys.T),
      trainPosition: x,
      trainSpeed: vx,
      takeUpPosition: y,
      sprocketAngle: ang,
      chainTravel: travel,
      dogEngaged: sys.dogForce > 0,
      dogForce: sys.dogForce,
      ardForce: sys.ardForce,
      ardTooth: sys.tooth === sys.tooth ? sys.tooth : null,
      slackSegments: sys.slack,
    };
  }

  /** After each step, with the system evaluated at (t, x, vx, y). */
  step(t: number, x: number, vx: number, y: number): void {
    if (this.budget <= 0) return;
    if (t >= this.next) {
      this.frames.push(this.snapshot(t, x, vx, y));
      this.next = t + this.interval;
    }
    const sys = this.sys;
    if (sys.maxT > this.peakValue) {
      this.peakValue = sys.maxT;
      this.peakTensions.set(sys.T);
      const p = this.peakScalars;
      p[0] = t;
      p[1] = x;
      p[2] = vx;
      p[3] = y;
      p[4] = sys.dogForce;
      p[5] = sys.ardForce;
      p[6] = sys.tooth;
      p[7] = sys.slack;
    }
  }

  private buildPeak(): Frame | null {
    if (this.peakValue < 0) return null;
    const p = this.peakScalars;
    const travel = this.sys.drive.displacement(p[0]);
    return {
      t: p[0],
      tensions: Array.from(this.peakTensions),
      trainPosition: p[1],
      trainSpeed: p[2],
      takeUpPosition: p[3],
      sprocketAngle: (travel / this.radius) % (2 * Math.PI),
      chainTravel: travel,
      dogEngaged: p[4] > 0,
      dogForce: p[4],
      ardForce: p[5],
      ardTooth: p[6] === p[6] ? p[6] : null,
      slackSegments: p[7],
    };
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
    // Keep within the budget: drop regular frames evenly, never the peak frame.
    if (out.length > this.budget) {
      const keep: Frame[] = [];
      const stride = out.length / this.budget;
      const chosen = new Set<number>();
      for (let i = 0; i < this.budget; i++) chosen.add(Math.floor(i * stride));
      const pi = out.findIndex((f) => f.peak);
      if (pi >= 0 && !chosen.has(pi)) {
        let nearest = -1;
        for (const c of chosen) if (nearest < 0 || Math.abs(c - pi) < Math.abs(nearest - pi)) nearest = c;
        chosen.delete(nearest);
        chosen.add(pi);
      }
      [...chosen].sort((a, b) => a - b).forEach((i) => keep.push(out[i]));
      return keep;
    }
    return out;
  }
}
