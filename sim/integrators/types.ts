import type { LiftSystem } from "../rhs";

/**
 * The state layout, packed once for every integrator: one flat vector
 *   [ positions (nPos) | velocities (nPos) | Zener strains (nZ) | speed-loop integral (0 or 1) | work | dissipated ]
 * with positions = chain stations w (n, relative to the drive's displacement), train fronts x (one per train),
 * take-up drop y, drive displacement u_d. Velocity of position k sits at iV + k.
 */
export interface StateLayout {
  n: number;
  trains: number;
  nPos: number;
  /** Offsets among the positions (add iV for the velocity). */
  iX: number;
  iY: number;
  iD: number;
  iV: number;
  iZ: number;
  nZ: number;
  /** Speed-loop integral, −1 when absent. */
  iPI: number;
  iWork: number;
  iDiss: number;
  size: number;
}

export function stateLayout(n: number, trains: number, zener: boolean, speedLoop: boolean): StateLayout {
  const nPos = n + trains + 2;
  const iV = nPos;
  const iZ = 2 * nPos;
  const nZ = zener ? n : 0;
  const iPI = speedLoop ? iZ + nZ : -1;
  const iWork = iZ + nZ + (speedLoop ? 1 : 0);
  return { n, trains, nPos, iX: n, iY: n + trains, iD: n + trains + 1, iV, iZ, nZ, iPI, iWork, iDiss: iWork + 1, size: iWork + 2 };
}

/** The full dynamic state at one time. */
export interface DynState {
  t: number;
  y: Float64Array;
}

/** What an integrator reports to the run after each accepted step (the system is evaluated at `st`). */
export interface RunHooks {
  /** Returns false to end the run early (a train left the track). */
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

export function newState(layout: StateLayout): DynState {
  return { t: 0, y: new Float64Array(layout.size) };
}
