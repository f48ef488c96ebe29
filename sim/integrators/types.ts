import type { LiftSystem } from "../rhs";

/** The full dynamic state at one time, plus the two energy integrals. */
export interface DynState {
  t: number;
  w: Float64Array; // chain displacement relative to drive transport, per station
  vw: Float64Array;
  x: number; // train front position
  vx: number;
  y: number; // take-up drop
  vy: number;
  work: number; // drive work so far, J
  dissipated: number; // energy dissipated so far, J
}

/** What an integrator reports to the run after each accepted step (the system is evaluated at `st`). */
export interface RunHooks {
  /** Returns false to end the run early (the train left the track). */
  step(st: DynState, dt: number, events: number, exactSeries: boolean): boolean;
  /** A series sample exactly at st.t (dense output). */
  sample(st: DynState): void;
  nextSampleTime(): number;
  /** Budget, abort and progress; throws a SimulationError. */
  check(steps: number, t: number): void;
  maxSteps: number;
}

export interface IntegratorResult {
  final: DynState;
  steps: number;
  timeStep: number | null;
  endedEarly: boolean;
}

export type Integrate = (sys: LiftSystem, initial: DynState, duration: number, hooks: RunHooks) => IntegratorResult;

export function newState(n: number): DynState {
  return { t: 0, w: new Float64Array(n), vw: new Float64Array(n), x: 0, vx: 0, y: 0, vy: 0, work: 0, dissipated: 0 };
}
