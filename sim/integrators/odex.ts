/**
 * The adaptive path: odex (Hairer & Wanner's GBS extrapolation) on the first-order system
 * [w, x, y, ẇ, ẋ, ẏ, drive work, dissipated energy]. Dense output samples the series exactly and
 * locates contact events (a catch point reaching the dog, the dog letting go at the release point);
 * the integration restarts at each located event and at the end of the drive ramp, so the right-hand
 * side is smooth within every solve.
 */
// A namespace import cannot fail at link time in any bundler; availability is checked at run time below.
import * as odexLib from "odex";
import { SimulationError } from "../errors";
import { EVENT_ENGAGE, EVENT_RELEASE, type LiftSystem } from "../rhs";
import type { DynState, IntegratorResult, RunHooks } from "./types";

export interface OdexSettings {
  tolerance: number;
  maxStepSize: number;
  maxExtrapolationColumns?: number;
}

export function integrateOdex(
  sys: LiftSystem,
  st: DynState,
  duration: number,
  hooks: RunHooks,
  cfg: OdexSettings,
): IntegratorResult {
  const n = sys.n;
  const N = 2 * n + 6;
  const IX = n;
  const IY = n + 1;
  const IVW = n + 2;
  const IVX = 2 * n + 2;
  const IVY = 2 * n + 3;
  const IW = 2 * n + 4;
  const ID = 2 * n + 5;
  const w = new Float64Array(n);
  const vw = new Float64Array(n);
  const aw = new Float64Array(n);

  const f = (t: number, Y: number[]): number[] => {
    for (let i = 0; i < n; i++) {
      w[i] = Y[i];
      vw[i] = Y[IVW + i];
    }
    sys.accel(t, w, vw, Y[IX], Y[IVX], Y[IY], Y[IVY], aw);
    const d = new Array<number>(N);
    for (let i = 0; i < n; i++) {
      d[i] = Y[IVW + i];
      d[IVW + i] = aw[i];
    }
    d[IX] = Y[IVX];
    d[IY] = Y[IVY];
    d[IVX] = sys.ax;
    d[IVY] = sys.ay;
    d[IW] = sys.drivePower;
    d[ID] = sys.dissipation;
    return d;
  };
  const toState = (t: number, Y: ArrayLike<number>, s: DynState) => {
    for (let i = 0; i < n; i++) {
      s.w[i] = Y[i];
      s.vw[i] = Y[IVW + i];
    }
    s.t = t;
    s.x = Y[IX];
    s.y = Y[IY];
    s.vx = Y[IVX];
    s.vy = Y[IVY];
    s.work = Y[IW];
    s.dissipated = Y[ID];
  };
  const evaluate = (s: DynState) => sys.accel(s.t, s.w, s.vw, s.x, s.vx, s.y, s.vy, aw);

  // Tolerances per state: displacements to ~10·tol m, velocities to ~100·tol m/s; the two energy
  // integrals are carried along without steering the step size.
  const tol = cfg.tolerance;
  const atol = new Array<number>(N);
  const rtol = new Array<number>(N);
  for (let i = 0; i < N; i++) {
    const isPos = i < IVW;
    atol[i] = isPos ? 10 * tol : 100 * tol;
    rtol[i] = tol;
  }
  atol[IW] = atol[ID] = 1e30;
  rtol[IW] = rtol[ID] = 1;

  const { Solver, Outcome } = odexLib;
  if (typeof Solver !== "function") {
    throw new SimulationError(
      "tolerance",
      'The odex integrator is not available in this build (the "odex" package did not load); use run.integrator "verlet".',
    );
  }
  const solver = new Solver(N);
  solver.relativeTolerance = rtol;
  solver.absoluteTolerance = atol;
  solver.denseOutput = true;
  solver.maxStepSize = cfg.maxStepSize;
  if (cfg.maxExtrapolationColumns) solver.maxExtrapolationColumns = cfg.maxExtrapolationColumns;
  solver.initialStepSize = Math.min(1e-4, cfg.maxStepSize);

  let Y: number[] = new Array<number>(N);
  for (let i = 0; i < n; i++) {
    Y[i] = st.w[i];
    Y[IVW + i] = st.vw[i];
  }
  Y[IX] = st.x;
  Y[IY] = st.y;
  Y[IVX] = st.vx;
  Y[IVY] = st.vy;
  Y[IW] = st.work;
  Y[ID] = st.dissipated;

  let t = st.t;
  let steps = 0;
  let lastH = solver.initialStepSize;
  const ramp = sys.s.drive.rampTime;
  const cur: DynState = { ...st, w: new Float64Array(n), vw: new Float64Array(n) };
  const probe: DynState = { ...st, w: new Float64Array(n), vw: new Float64Array(n) };
  let endedEarly = false;

  const denseState = (dense: (c: number, x: number) => number, tt: number): number[] => {
    const out = new Array<number>(N);
    for (let i = 0; i < N; i++) out[i] = dense(i, tt);
    return out;
  };
  // Material coordinate at the dog, from dense output of the few components it needs.
  const xiDogDense = (dense: (c: number, x: number) => number, tt: number): number => {
    const xx = dense(IX, tt);
    const q = xx - sys.dogOffset - sys.chainFrom;
    const h = sys.loop.hStrand;
    let j = Math.floor(q / h);
    if (j < 0) j = 0;
    else if (j >= sys.loop.nsStrand) j = sys.loop.nsStrand - 1;
    const fr = q / h - j;
    const wq = dense(j, tt) * (1 - fr) + dense(j + 1, tt) * fr;
    return q - sys.drive.displacement(tt) - wq;
  };
  const bisect = (g: (tt: number) => number, a: number, b: number): number => {
    let ga = g(a);
    for (let it = 0; it < 60 && b - a > 1e-12 * Math.max(1, b); it++) {
      const m = 0.5 * (a + b);
      const gm = g(m);
      if (gm > 0 === ga > 0) {
        a = m;
        ga = gm;
      } else b = m;
    }
    return b;
  };

  while (t < duration - 1e-12) {
    const segEnd = ramp > 0 && t < ramp - 1e-12 && ramp < duration ? ramp : duration;
    let restart: { t: number; Y: number[]; mode: () => void; flag: number } | null = null;
    let stop = false;
    solver.initialStepSize = lastH;
    solver.maxSteps = Math.max(10, hooks.maxSteps - steps);
    const res = solver.solve(f, t, Y, segEnd, (nr, xold, x, yv, dense) => {
      if (nr === 1 || !dense) return true;
      lastH = x - xold;
      // Contact events inside this step: locate them, and restart there with the new mode.
      const inZoneEnd = sys.dogInZone(yv[IX]);
      if (sys.engaged === sys.engaged && !inZoneEnd) {
        const xOld = dense(IX, xold);
        const limit = yv[IX] - sys.dogOffset >= sys.dogRelease ? sys.dogRelease : sys.chainFrom;
        const g = (tt: number) => dense(IX, tt) - sys.dogOffset - limit;
        const te = Math.sign(g(xold)) !== Math.sign(g(x)) ? bisect(g, xold, x) : x;
        void xOld;
        restart = {
          flag: EVENT_RELEASE,
          t: te,
          Y: denseState(dense, te),
          mode: () => {
            sys.engaged = NaN;
            sys.lastCatchIndex = NaN;
          },
        };
      } else if (inZoneEnd && sys.lastCatchIndex === sys.lastCatchIndex) {
        const K0 = sys.lastCatchIndex;
        const xiEnd = xiDogDense(dense, x);
        if (sys.lattice.indexAtOrBehind(xiEnd) < K0) {
          const target = sys.lattice.at(K0);
          const te = bisect((tt) => xiDogDense(dense, tt) - target, xold, x);
          restart = {
            flag: EVENT_ENGAGE,
            t: te,
            Y: denseState(dense, te),
            mode: () => {
              sys.engaged = K0;
              sys.engageOffset = 0; // located exactly
              sys.lastCatchIndex = K0 - 1;
            },
          };
        }
      }
      const tEnd = restart ? restart.t : x;
      // Exact series samples from the dense output.
      while (hooks.nextSampleTime() <= tEnd + 1e-12) {
        const ts = hooks.nextSampleTime();
        toState(ts, denseState(dense, ts), probe);
        evaluate(probe);
        hooks.sample(probe);
      }
      steps++;
      if (restart) {
        const r = restart as { t: number; Y: number[]; mode: () => void; flag: number };
        toState(r.t, r.Y, cur);
        evaluate(cur);
        const ev = sys.updateModes(r.t, cur.w, cur.x);
        r.mode();
        evaluate(cur);
        if (!hooks.step(cur, r.t - xold, ev | r.flag, true)) stop = true;
        return false;
      }
      toState(x, yv, cur);
      evaluate(cur);
      const ev = sys.updateModes(x, cur.w, cur.x);
      if (ev & (EVENT_ENGAGE | EVENT_RELEASE)) evaluate(cur);
      if (!hooks.step(cur, x - xold, ev, true)) {
        stop = true;
        return false;
      }
      if ((steps & 15) === 0) hooks.check(steps, x);
      return true;
    });
    if (stop) {
      endedEarly = true;
      break;
    }
    if (restart) {
      const r = restart as { t: number; Y: number[] };
      t = r.t;
      Y = r.Y;
      continue;
    }
    if (res.outcome === Outcome.MaxStepsExceeded) {
      throw new SimulationError(
        "budget-steps",
        `odex used its step budget (${hooks.maxSteps} steps) at t = ${t.toFixed(3)} s of ${duration} s. ` +
          `The chain model is stiff for this explicit method: use the default integrator (verlet), fewer run.segments or a looser run.tolerance.`,
        t,
      );
    }
    if (res.outcome !== Outcome.Converged) {
      throw new SimulationError("tolerance", `odex stopped at t = ${res.xEnd} s without converging.`, res.xEnd);
    }
    t = segEnd;
    Y = res.y;
  }
  toState(t, Y, cur);
  evaluate(cur);
  Object.assign(st, { ...cur, w: st.w, vw: st.vw });
  st.w.set(cur.w);
  st.vw.set(cur.vw);
  return { final: st, steps, timeStep: null, endedEarly };
}
