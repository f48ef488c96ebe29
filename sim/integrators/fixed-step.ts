/**
 * Structure-preserving fixed-step path: velocity Verlet (kick–drift–kick). The conservative forces
 * (chain springs, weight, contacts) are integrated symplectically; velocity-dependent forces (damping,
 * friction, drag) use the half-step velocity. One force evaluation per step. The step is a fraction
 * (run.stepFraction) of the damped central-difference stability limit 2(√(1+ζ²) − ζ)/ω_max, with ω_max
 * bounded from the stiffness of every station, the contacts and the take-up (see LiftSystem.stabilityLimit).
 */
import { SimulationError } from "../errors";
import { EVENT_ENGAGE, EVENT_RELEASE, type LiftSystem } from "../rhs";
import type { DynState, IntegratorResult, RunHooks } from "./types";

export function verletStep(sys: LiftSystem, stepFraction: number, maxStep: number): number {
  return Math.min(stepFraction * sys.stabilityLimit().dt, maxStep);
}

export function integrateVerlet(
  sys: LiftSystem,
  st: DynState,
  duration: number,
  hooks: RunHooks,
  dtWanted: number,
): IntegratorResult {
  const nSteps = Math.ceil(duration / dtWanted - 1e-9);
  if (nSteps > hooks.maxSteps) {
    throw new SimulationError(
      "budget-steps",
      `This run needs ${nSteps} steps of ${dtWanted.toExponential(2)} s (stability limit of the stiffest part), ` +
        `more than the budget of ${hooks.maxSteps}. Use fewer run.segments, a softer contact, or a shorter run.duration.`,
      0,
      { stepsNeeded: nSteps, timeStep: dtWanted },
    );
  }
  const dt = duration / nSteps;
  const n = sys.n;
  const { w, vw } = st;
  const aw = new Float64Array(n);
  const hdt = 0.5 * dt;
  const drive = sys.drive;
  const dNode = sys.loop.driveNode;
  sys.driveAccelInRhs = false;
  sys.accel(st.t, w, vw, st.x, st.vx, st.y, st.vy, aw);
  let steps = 0;
  const t0 = st.t;
  try {
    for (let k = 1; k <= nSteps; k++) {
      const p0 = sys.drivePower;
      const d0 = sys.dissipation;
      const tPrev = t0 + (k - 1) * dt;
      // Drive velocity change over each half step, taken out of the relative velocities exactly.
      const dv1 = drive.velocity(tPrev + hdt) - drive.velocity(tPrev);
      const dv2 = drive.velocity(tPrev + dt) - drive.velocity(tPrev + hdt);
      for (let i = 0; i < n; i++) {
        const v = vw[i] + hdt * aw[i] - dv1;
        vw[i] = v;
        w[i] += dt * v;
      }
      vw[dNode] = 0;
      w[dNode] = 0;
      st.vx += hdt * sys.ax;
      st.x += dt * st.vx;
      st.vy += hdt * sys.ay;
      st.y += dt * st.vy;
      const t = k === nSteps ? t0 + duration : t0 + k * dt;
      st.t = t;
      sys.accel(t, w, vw, st.x, st.vx, st.y, st.vy, aw);
      st.work += hdt * (p0 + sys.drivePower);
      st.dissipated += hdt * (d0 + sys.dissipation);
      for (let i = 0; i < n; i++) vw[i] += hdt * aw[i] - dv2;
      vw[dNode] = 0;
      st.vx += hdt * sys.ax;
      st.vy += hdt * sys.ay;
      steps++;
      const ev = sys.updateModes(t, w, st.x);
      // A contact that just started or ended changes the forces: re-evaluate so the next kick uses them.
      if (ev & (EVENT_ENGAGE | EVENT_RELEASE)) sys.accel(t, w, vw, st.x, st.vx, st.y, st.vy, aw);
      if (!hooks.step(st, dt, ev, false)) return { final: st, steps, timeStep: dt, endedEarly: true };
      if ((steps & 127) === 0) hooks.check(steps, t);
    }
  } finally {
    sys.driveAccelInRhs = true;
  }
  return { final: st, steps, timeStep: dt, endedEarly: false };
}

/** Classical RK4 on the same system (first-order form), for the benchmark's comparison only. */
export function integrateRk4(sys: LiftSystem, st: DynState, duration: number, dt: number, onStep?: (st: DynState) => void): number {
  const n = sys.n;
  const N = 2 * n + 4;
  const y = new Float64Array(N);
  const pack = (s: DynState) => {
    y.set(s.w, 0);
    y[n] = s.x;
    y[n + 1] = s.y;
    y.set(s.vw, n + 2);
    y[2 * n + 2] = s.vx;
    y[2 * n + 3] = s.vy;
  };
  const w = new Float64Array(n);
  const vw = new Float64Array(n);
  const aw = new Float64Array(n);
  const f = (t: number, Y: Float64Array, dY: Float64Array) => {
    for (let i = 0; i < n; i++) {
      w[i] = Y[i];
      vw[i] = Y[n + 2 + i];
    }
    sys.accel(t, w, vw, Y[n], Y[2 * n + 2], Y[n + 1], Y[2 * n + 3], aw);
    for (let i = 0; i < n; i++) {
      dY[i] = Y[n + 2 + i];
      dY[n + 2 + i] = aw[i];
    }
    dY[n] = Y[2 * n + 2];
    dY[n + 1] = Y[2 * n + 3];
    dY[2 * n + 2] = sys.ax;
    dY[2 * n + 3] = sys.ay;
  };
  pack(st);
  const k1 = new Float64Array(N), k2 = new Float64Array(N), k3 = new Float64Array(N), k4 = new Float64Array(N);
  const tmp = new Float64Array(N);
  const nSteps = Math.ceil(duration / dt - 1e-9);
  const h = duration / nSteps;
  let t = st.t;
  for (let k = 0; k < nSteps; k++) {
    f(t, y, k1);
    for (let i = 0; i < N; i++) tmp[i] = y[i] + 0.5 * h * k1[i];
    f(t + 0.5 * h, tmp, k2);
    for (let i = 0; i < N; i++) tmp[i] = y[i] + 0.5 * h * k2[i];
    f(t + 0.5 * h, tmp, k3);
    for (let i = 0; i < N; i++) tmp[i] = y[i] + h * k3[i];
    f(t + h, tmp, k4);
    for (let i = 0; i < N; i++) y[i] += (h / 6) * (k1[i] + 2 * k2[i] + 2 * k3[i] + k4[i]);
    t += h;
    // Unpack and let the system see the accepted state (modes, diagnostics).
    for (let i = 0; i < n; i++) {
      st.w[i] = y[i];
      st.vw[i] = y[n + 2 + i];
    }
    st.t = t;
    st.x = y[n];
    st.y = y[n + 1];
    st.vx = y[2 * n + 2];
    st.vy = y[2 * n + 3];
    sys.accel(t, st.w, st.vw, st.x, st.vx, st.y, st.vy, aw);
    sys.updateModes(t, st.w, st.x);
    onStep?.(st);
    if (!Number.isFinite(sys.maxT)) return k + 1;
  }
  return nSteps;
}
