/**
 * simulate(): one deterministic, synchronous run of a scenario. Pure TypeScript: runs the same in a
 * browser Web Worker, a Node worker thread and the CLI.
 */
import { SimulationError } from "./errors";
import { FrameRecorder, SeriesRecorder, seriesValues, type Frame, type Series } from "./frames";
import { integrateVerlet, verletStep } from "./integrators/fixed-step";
import { integrateOdex } from "./integrators/odex";
import type { DynState, IntegratorResult, RunHooks } from "./integrators/types";
import { LiftSystem } from "./rhs";
import { parseScenario, type Integrator, type Scenario } from "./schema";
import { initialState } from "./start";
import { withElongation } from "./wear";
import { SummaryRecorder, type StepView, type Summary } from "./summary";

export interface SimulateOptions {
  /** Fraction of simulated time done, 0…1, called about every 1 %. */
  onProgress?: (fraction: number) => void;
  signal?: { aborted: boolean };
  /** Replay frames kept (default 600; 0 for none). */
  frameBudget?: number;
  /** Series sample interval, s (default 0.01). */
  sampleInterval?: number;
  /** Leave the series out (smaller results). */
  series?: boolean;
  budget?: { maxSteps?: number; wallTimeMs?: number };
  /** Overrides run.segments / run.integrator. */
  segments?: number;
  integrator?: Integrator;
}

export interface Layout {
  trackLength: number;
  chainFrom: number;
  chainTo: number;
  loopLength: number;
  strandLength: number;
  /** Loop position of every station (segment i joins station i to i+1). */
  stations: number[];
  driveStation: number;
  takeUpStation: number;
  topStation: number;
  catchSpacing: number;
  catchPoints: number;
  /** Take-up's starting distance below its top stop, m (takeUp.position, lowered by chain.elongation). */
  takeUpStart: number;
}

export interface SimulationResult {
  summary: Summary;
  series: Series;
  frames: Frame[];
  notes: string[];
  diagnostics: Record<string, number | string | boolean | null>;
  layout: Layout;
}

export const DEFAULT_FRAME_BUDGET = 600;
export const DEFAULT_SAMPLE_INTERVAL = 0.01;
export const DEFAULT_MAX_STEPS = 20_000_000;
export const DEFAULT_WALL_TIME_MS = 120_000;

const now = () => (typeof performance !== "undefined" ? performance.now() : Date.now());

export function simulate(input: Scenario | unknown, options: SimulateOptions = {}): SimulationResult {
  const parsed = parseScenario(input);
  if (!parsed.ok) {
    const first = parsed.issues[0];
    throw new SimulationError("invalid-scenario", `${first.path}: ${first.message}`, 0, { issues: parsed.issues });
  }
  // Chain wear: a longer loop on the same path (pitch, catch spacing, take-up start); see sim/wear.ts.
  const s = withElongation(parsed.scenario);
  const started = now();
  const duration = s.run.duration;
  const integrator: Integrator = options.integrator ?? s.run.integrator;
  const sampleInterval = options.sampleInterval ?? DEFAULT_SAMPLE_INTERVAL;
  if (!(sampleInterval > 0) || !Number.isFinite(sampleInterval))
    throw new SimulationError("invalid-scenario", "sampleInterval must be a positive number of seconds");
  const frameBudget = Math.max(0, Math.floor(options.frameBudget ?? DEFAULT_FRAME_BUDGET));
  const maxSteps = options.budget?.maxSteps ?? DEFAULT_MAX_STEPS;
  const wallTimeMs = options.budget?.wallTimeMs ?? DEFAULT_WALL_TIME_MS;
  const sys = new LiftSystem(s, { segments: options.segments });
  const L = sys.layout;
  const notes: string[] = [];
  const st = initialState(sys, notes);
  sys.updateModes(0, st.y);
  const dY = new Float64Array(L.size);
  sys.rhs(0, st.y, dY, true);
  const e0 = sys.energy(st.y);

  const summary = new SummaryRecorder(sys);
  const frames = new FrameRecorder(sys, duration, frameBudget);
  const series = new SeriesRecorder(sampleInterval, options.series !== false, sys.trains.length);
  const vals: number[] = [];
  const trackEnd = sys.track.length;
  let reachedEnd = false;
  let nextProgress = 0.01;
  const breaking = s.chain.breakingStrength;
  // Train 0 and the take-up under the names the summary reads.
  const view: StepView = { t: 0, x: 0, vx: 0, y: 0, vy: 0 };
  const viewOf = (x: DynState) => {
    const Y = x.y;
    view.t = x.t;
    view.x = Y[L.iX];
    view.vx = Y[L.iV + L.iX];
    view.y = Y[L.iY];
    view.vy = Y[L.iV + L.iY];
    view.Y = Y; // every train's position and speed, for the per-train figures
    return view;
  };

  const record = (x: DynState, dt: number, events: number) => {
    summary.step(viewOf(x), dt, events);
    frames.step(x.t, x.y);
  };
  record(st, 0, 0);
  series.stepEnd(0, seriesValues(sys, st.y, vals));

  const finiteState = (Y: Float64Array) => {
    for (let j = 0; j < sys.trains.length; j++) if (!Number.isFinite(Y[L.iX + j]) || !Number.isFinite(Y[L.iV + L.iX + j])) return false;
    return Number.isFinite(Y[L.iY]) && Number.isFinite(Y[L.iV + L.iD]) && Number.isFinite(sys.maxT);
  };
  const hooks: RunHooks = {
    maxSteps,
    step(x, dt, events, exact) {
      const Y = x.y;
      if (!finiteState(Y)) {
        throw new SimulationError(
          "non-finite",
          `The solution became non-finite at t = ${x.t.toFixed(4)} s. Lower run.stepFraction or use fewer run.segments.`,
          x.t,
        );
      }
      if (sys.maxT > 1e4 * breaking || Math.abs(Y[L.iY]) > 1e3) {
        throw new SimulationError(
          "tolerance",
          `The solution grew without bound at t = ${x.t.toFixed(4)} s (chain tension ${sys.maxT.toExponential(2)} N): ` +
            `the step is unstable for this scenario. Lower run.stepFraction or soften the contacts.`,
          x.t,
        );
      }
      record(x, dt, events);
      if (!exact) series.stepEnd(x.t, seriesValues(sys, Y, vals));
      for (let j = 0; j < sys.trains.length; j++) {
        if (sys.trains[j].active && Y[L.iX + j] >= trackEnd) {
          reachedEnd = true;
          return false;
        }
      }
      return true;
    },
    sample(x) {
      series.emit(x.t, seriesValues(sys, x.y, vals));
    },
    nextSampleTime() {
      return options.series === false ? Infinity : series.nextTime;
    },
    check(steps, t) {
      if (options.signal?.aborted) throw new SimulationError("aborted", `The run was cancelled at t = ${t.toFixed(2)} s.`, t);
      const el = now() - started;
      if (el > wallTimeMs)
        throw new SimulationError(
          "budget-time",
          `The run used its wall-time budget of ${wallTimeMs} ms at t = ${t.toFixed(2)} s of ${duration} s (${steps} steps).`,
          t,
        );
      if (steps > maxSteps) throw new SimulationError("budget-steps", `The run used its step budget of ${maxSteps} steps.`, t);
      const frac = t / duration;
      if (options.onProgress && frac >= nextProgress) {
        options.onProgress(Math.min(1, frac));
        nextProgress = frac + 0.01;
      }
    },
  };

  const lim = sys.stabilityLimit();
  let res: IntegratorResult;
  if (integrator === "odex") {
    res = integrateOdex(sys, st, duration, hooks, {
      tolerance: s.run.tolerance,
      maxStepSize: Math.min(0.01, sampleInterval),
    });
  } else {
    const dt = verletStep(sys, s.run.stepFraction, Math.min(0.005, sampleInterval));
    res = integrateVerlet(sys, st, duration, hooks, dt);
  }
  const fin = res.final;
  sys.rhs(fin.t, fin.y, dY, true);
  const e1 = sys.energy(fin.y);
  const work = fin.y[L.iWork];
  const dissipated = fin.y[L.iDiss];
  const residual = Math.abs(work) > 1 ? Math.abs(work - (e1 - e0) - dissipated) / Math.abs(work) : null;
  options.onProgress?.(1);
  const sum = summary.finish({
    steps: res.steps,
    wallTimeMs: now() - started,
    energyResidual: residual,
    simulatedTime: fin.t,
    integrator,
    timeStep: res.timeStep,
    trainReachedEnd: reachedEnd,
  });

  const left = sys.trains.filter((tr) => tr.gone).length;
  if (left > 0) notes.push(`${left} of ${sys.trains.length} trains left the track at its end while others ran on (each one's figures end there).`);
  if (reachedEnd) notes.push(`A train reached the end of the track at t = ${fin.t.toFixed(2)} s; the run ends there.`);
  if (sum.engagementTime === null) notes.push("The dog never engaged a catch point.");
  if (sum.slackSegments > 0) notes.push(`The chain went slack: up to ${sum.slackSegments} segment(s) at once carried no tension.`);
  if (sum.takeUpEndStop) notes.push("The take-up hit an end stop.");
  if (sum.rollbackDistance - sum.peakArdCompression > s.antiRollback.toothSpacing)
    notes.push(
      `The train rolled back ${sum.rollbackDistance.toFixed(3)} m, more than one tooth spacing (${s.antiRollback.toothSpacing} m): an anti-rollback failure in this model.`,
    );
  if (sum.ardCatches > 0) notes.push(`The train settled back onto the ARD ${sum.ardCatches} time(s).`);
  if (sum.steadyTension === null) notes.push("No steady climb was reached (whole train on the straight incline, carried by the dog at chain speed, drive at full speed).");
  if (sum.minSafetyFactor < s.limits.requiredSafetyFactor)
    notes.push(`The safety factor fell to ${sum.minSafetyFactor.toFixed(2)} (required ${s.limits.requiredSafetyFactor}).`);
  notes.push("Results support, and never replace, review by a qualified engineer; local codes, the manufacturer's data and licensed practice govern.");

  const loop = sys.loop;
  let minL = Infinity;
  let maxL = 0;
  for (const l of loop.L) {
    minL = Math.min(minL, l);
    maxL = Math.max(maxL, l);
  }
  const c = Math.sqrt(s.chain.axialStiffness / s.chain.massPerLength);
  return {
    summary: sum,
    series: series.series,
    frames: frames.finish(),
    notes,
    diagnostics: {
      integrator,
      segments: loop.segments,
      minSegmentLength: minL,
      maxSegmentLength: maxL,
      waveSpeed: c,
      highestFrequency: lim.omega,
      stabilityLimit: lim.dt,
      timeStep: res.timeStep,
      contactStiffness: sys.dogStiffness,
      ardContactStiffness: sys.ardStiffness,
      driveModel: s.drive.motor.kind,
      driveLocation: s.drive.location,
      zenerStiffness: sys.zenerStiffness,
      endStopStiffness: sys.takeUp.stopStiffness,
      driveWork: work,
      dissipated,
      energyChange: e1 - e0,
      endedEarly: res.endedEarly,
    },
    layout: {
      trackLength: sys.track.length,
      chainFrom: s.lift.chainFrom,
      chainTo: s.lift.chainTo,
      loopLength: loop.length,
      strandLength: loop.strandLength,
      stations: Array.from(loop.q),
      driveStation: sys.driveNode,
      takeUpStation: loop.takeUpNode,
      topStation: loop.topNode,
      catchSpacing: s.chain.catchSpacing,
      catchPoints: sys.lattice.count,
      takeUpStart: s.takeUp.position,
    },
  };
}
