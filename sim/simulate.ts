/**
 * simulate(): one deterministic, synchronous run of a scenario. Pure TypeScript: runs the same in a
 * browser Web Worker, a Node worker thread and the CLI.
 */
import { SimulationError } from "./errors";
import { FrameRecorder, SeriesRecorder, seriesValues, type Frame, type Series } from "./frames";
import { integrateVerlet, verletStep } from "./integrators/fixed-step";
import { integrateOdex } from "./integrators/odex";
import { newState, type DynState, type IntegratorResult, type RunHooks } from "./integrators/types";
import { LiftSystem } from "./rhs";
import { parseScenario, type Integrator, type Scenario } from "./schema";
import { SummaryRecorder, type Summary } from "./summary";

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
  const s = parsed.scenario;
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
  const n = sys.n;

  const st = newState(n);
  st.x = s.trains[0].startPosition;
  st.vx = s.trains[0].entrySpeed;
  const notes: string[] = [];
  // A train given at rest on the ARD starts settled on the last tooth behind its pawl (in static equilibrium).
  if (st.vx === 0 && sys.ratchet.enabled) {
    const back = -sys.train.force(st.x, 0);
    const tooth = sys.ratchet.toothBehind(st.x - sys.dogOffset);
    if (back > 0 && tooth === tooth && st.x - sys.dogOffset - tooth <= s.antiRollback.toothSpacing) {
      st.x = tooth + sys.dogOffset - back / sys.ardStiffness;
      sys.pawlMax = Math.max(sys.pawlMax, tooth);
      sys.tooth = tooth;
      notes.push(`The train starts at rest on the ARD tooth at ${tooth.toFixed(3)} m (front at ${st.x.toFixed(3)} m).`);
    }
  }
  // The chain stands still at t = 0; relative to drive transport that is ẇ = −v_d(0) (non-zero for a sudden start).
  const vd0 = sys.drive.velocity(0);
  for (let i = 0; i < n; i++) st.vw[i] = i === sys.loop.driveNode ? 0 : -vd0;
  sys.updateModes(0, st.w, st.x);
  const aw = new Float64Array(n);
  sys.accel(0, st.w, st.vw, st.x, st.vx, st.y, st.vy, aw);
  const e0 = sys.energy(0, st.w, st.vw, st.x, st.vx, st.y, st.vy);

  const summary = new SummaryRecorder(sys);
  const frames = new FrameRecorder(sys, duration, frameBudget);
  const series = new SeriesRecorder(sampleInterval, options.series !== false);
  const vals: number[] = [];
  const trackEnd = sys.track.length;
  let reachedEnd = false;
  let nextProgress = 0.01;
  const breaking = s.chain.breakingStrength;

  const record = (x: DynState, dt: number, events: number) => {
    summary.step(x, dt, events);
    frames.step(x.t, x.x, x.vx, x.y);
  };
  record(st, 0, 0);
  series.stepEnd(0, seriesValues(sys, st.x, st.vx, st.y, vals));

  const hooks: RunHooks = {
    maxSteps,
    step(x, dt, events, exact) {
      if (!Number.isFinite(x.x) || !Number.isFinite(x.y) || !Number.isFinite(sys.maxT) || !Number.isFinite(x.vx)) {
        throw new SimulationError(
          "non-finite",
          `The solution became non-finite at t = ${x.t.toFixed(4)} s. Lower run.stepFraction or use fewer run.segments.`,
          x.t,
        );
      }
      if (sys.maxT > 1e4 * breaking || Math.abs(x.y) > 1e3) {
        throw new SimulationError(
          "tolerance",
          `The solution grew without bound at t = ${x.t.toFixed(4)} s (chain tension ${sys.maxT.toExponential(2)} N): ` +
            `the step is unstable for this scenario. Lower run.stepFraction or soften the contacts.`,
          x.t,
        );
      }
      record(x, dt, events);
      if (!exact) series.stepEnd(x.t, seriesValues(sys, x.x, x.vx, x.y, vals));
      if (x.x >= trackEnd) {
        reachedEnd = true;
        return false;
      }
      return true;
    },
    sample(x) {
      series.emit(x.t, seriesValues(sys, x.x, x.vx, x.y, vals));
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
  sys.accel(fin.t, fin.w, fin.vw, fin.x, fin.vx, fin.y, fin.vy, aw);
  const e1 = sys.energy(fin.t, fin.w, fin.vw, fin.x, fin.vx, fin.y, fin.vy);
  const work = fin.work;
  const residual = Math.abs(work) > 1 ? Math.abs(work - (e1 - e0) - fin.dissipated) / Math.abs(work) : null;
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

  if (reachedEnd) notes.push(`The train reached the end of the track at t = ${fin.t.toFixed(2)} s; the run ends there.`);
  if (sum.engagementTime === null) notes.push("The dog never engaged a catch point.");
  if (sum.slackSegments > 0) notes.push(`The chain went slack: up to ${sum.slackSegments} segment(s) at once carried no tension.`);
  if (sum.takeUpEndStop) notes.push("The take-up hit an end stop.");
  if (sum.rollbackDistance - sum.peakArdCompression > s.antiRollback.toothSpacing)
    notes.push(
      `The train rolled back ${sum.rollbackDistance.toFixed(3)} m, more than one tooth spacing (${s.antiRollback.toothSpacing} m): an anti-rollback failure in this model.`,
    );
  if (sum.ardCatches > 0) notes.push(`The train settled back onto the ARD ${sum.ardCatches} time(s).`);
  if (sum.steadyTension === null) notes.push("No steady climb was reached (whole train on the incline, dog engaged, speed ≥ 95 % of chain speed).");
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
      endStopStiffness: sys.takeUp.stopStiffness,
      driveWork: work,
      dissipated: fin.dissipated,
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
      driveStation: loop.driveNode,
      takeUpStation: loop.takeUpNode,
      topStation: loop.topNode,
      catchSpacing: s.chain.catchSpacing,
      catchPoints: sys.lattice.count,
    },
  };
}
