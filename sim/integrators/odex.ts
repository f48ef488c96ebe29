/**
 * The adaptive path: odex (Hairer & Wanner's GBS extrapolation) on the flat state of integrators/types.ts
 * through the same rhs as every other integrator. Dense output samples the series exactly and locates
 * contact events (a catch point reaching a dog, a dog letting go where the chain ends); the integration
 * restarts at each located event, at the drive's kinks and phase changes and at each train's startTime, so
 * the right-hand side is smooth within every solve.
 */
// A namespace import cannot fail at link time in any bundler; availability is checked at run time below.
import * as odexLib from "odex";
import { SimulationError } from "../errors";
import { EVENT_ENGAGE, EVENT_RELEASE, EVENTS_REEVALUATE, type LiftSystem } from "../rhs";
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
  const L = sys.layout;
  const N = L.size;
  const work = new Float64Array(N);
  const dY = new Float64Array(N);

  const f = (t: number, Y: number[]): number[] => {
    work.set(Y);
    sys.rhs(t, work, dY, true);
    return Array.from(dY);
  };
  const evaluate = (s: DynState) => sys.rhs(s.t, s.y, dY, true);

  // Tolerances per state: displacements to ~10·tol m, velocities to ~100·tol m/s, Zener strains to
  // tol·1e-3; the speed loop's integral like a displacement; the two energy integrals are carried along
  // without steering the step size.
  const tol = cfg.tolerance;
  const atol = new Array<number>(N);
  const rtol = new Array<number>(N).fill(tol);
  for (let i = 0; i < N; i++) atol[i] = i < L.iV ? 10 * tol : i < L.iZ ? 100 * tol : i < L.iZ + L.nZ ? 1e-3 * tol : 10 * tol;
  atol[L.iWork] = atol[L.iDiss] = 1e30;
  rtol[L.iWork] = rtol[L.iDiss] = 1;

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

  let Y: number[] = Array.from(st.y);
  let t = st.t;
  let steps = 0;
  let lastH = solver.initialStepSize;
  const breaks = [...sys.driveControl.breakpoints(), ...sys.trains.map((tr) => tr.settings.startTime)]
    .filter((b) => b > 0 && b < duration)
    .sort((a, b) => a - b);
  const cur: DynState = { t, y: new Float64Array(N) };
  const probe: DynState = { t, y: new Float64Array(N) };
  let endedEarly = false;

  const denseState = (dense: (c: number, x: number) => number, tt: number): number[] => {
    const out = new Array<number>(N);
    for (let i = 0; i < N; i++) out[i] = dense(i, tt);
    return out;
  };
  // Material coordinate at a train's dog, from dense output of the few components it needs.
  const xiDogDense = (dense: (c: number, x: number) => number, j: number, tt: number): number => {
    const tr = sys.trains[j];
    const q = dense(L.iX + j, tt) - tr.dogOffset - sys.chainFrom;
    const h = sys.loop.hStrand;
    let k = Math.floor(q / h);
    if (k < 0) k = 0;
    else if (k >= sys.loop.nsStrand) k = sys.loop.nsStrand - 1;
    const fr = q / h - k;
    const wq = dense(k, tt) * (1 - fr) + dense(k + 1, tt) * fr;
    return q - dense(L.iD, tt) - wq;
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

  type Restart = { t: number; Y: number[]; mode: () => void; flag: number };
  while (t < duration - 1e-12) {
    const segEnd = breaks.find((b) => b > t + 1e-12) ?? duration;
    let restart: Restart | null = null;
    let stop = false;
    solver.initialStepSize = lastH;
    solver.maxSteps = Math.max(10, hooks.maxSteps - steps);
    const res = solver.solve(f, t, Y, segEnd, (nr, xold, x, yv, dense) => {
      if (nr === 1 || !dense) return true;
      lastH = x - xold;
      // Contact events inside this step, per train: locate the earliest, and restart there with its mode.
      let found: Restart | null = null;
      for (let j = 0; j < sys.trains.length; j++) {
        const tr = sys.trains[j];
        if (!tr.active) continue;
        const xEnd = yv[L.iX + j];
        const inZoneEnd = sys.dogInZone(xEnd, tr.dogOffset);
        let cand: Restart | null = null;
        if (tr.engaged === tr.engaged && !inZoneEnd) {
          const limit = xEnd - tr.dogOffset >= sys.dogRelease ? sys.dogRelease : sys.chainFrom;
          const g = (tt: number) => dense(L.iX + j, tt) - tr.dogOffset - limit;
          const te = Math.sign(g(xold)) !== Math.sign(g(x)) ? bisect(g, xold, x) : x;
          cand = { flag: EVENT_RELEASE, t: te, Y: [], mode: () => ((tr.engaged = NaN), (tr.lastCatchIndex = NaN)) };
        } else if (inZoneEnd && tr.lastCatchIndex === tr.lastCatchIndex) {
          const K0 = tr.lastCatchIndex;
          if (sys.lattice.indexAtOrBehind(xiDogDense(dense, j, x)) < K0) {
            const target = sys.lattice.at(K0);
            const te = bisect((tt) => xiDogDense(dense, j, tt) - target, xold, x);
            cand = {
              flag: EVENT_ENGAGE,
              t: te,
              Y: [],
              mode: () => {
                tr.engaged = K0;
                tr.engageOffset = 0; // located exactly
                tr.lastCatchIndex = K0 - 1;
              },
            };
          }
        }
        if (cand && (!found || cand.t < found.t)) found = cand;
      }
      if (found) {
        found.Y = denseState(dense, found.t);
        restart = found;
      }
      const tEnd = restart ? restart.t : x;
      // Exact series samples from the dense output.
      while (hooks.nextSampleTime() <= tEnd + 1e-12) {
        const ts = hooks.nextSampleTime();
        probe.t = ts;
        probe.y.set(denseState(dense, ts));
        evaluate(probe);
        hooks.sample(probe);
      }
      steps++;
      if (restart) {
        const r = restart as Restart;
        cur.t = r.t;
        cur.y.set(r.Y);
        evaluate(cur);
        const ev = sys.updateModes(r.t, cur.y);
        r.mode();
        evaluate(cur);
        r.Y = Array.from(cur.y);
        if (!hooks.step(cur, r.t - xold, ev | r.flag, true)) stop = true;
        return false;
      }
      cur.t = x;
      cur.y.set(yv);
      evaluate(cur);
      const ev = sys.updateModes(x, cur.y);
      if (ev & EVENTS_REEVALUATE) evaluate(cur);
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
      const r = restart as Restart;
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
    // Modes at a breakpoint (drive phase, a train appearing) change the state or the law: apply them.
    cur.t = t;
    cur.y.set(res.y);
    evaluate(cur);
    if (sys.updateModes(t, cur.y) & EVENTS_REEVALUATE) evaluate(cur);
    Y = Array.from(cur.y);
  }
  st.t = t;
  st.y.set(Y);
  evaluate(st);
  return { final: st, steps, timeStep: null, endedEarly };
}
