/**
 * Structure-preserving fixed-step path: velocity Verlet (kick–drift–kick) over the flat state. The
 * conservative forces (chain springs, weight, contacts) are integrated symplectically; velocity-dependent
 * forces (damping, friction, drag, the motor's slip law) use the half-step velocity; the first-order states
 * (Zener strains, the speed loop's integral) advance with the derivative at the step's start. One rhs
 * evaluation per step. The step is a fraction (run.stepFraction) of the damped central-difference stability
 * limit 2(√(1+ζ²) − ζ)/ω_max (see LiftSystem.stabilityLimit). A prescribed drive speed (ideal drive, brake)
 * is applied exactly per half step, so a ramp or a sudden start shorter than a step is still right.
 */
import { SimulationError } from "../errors";
import { EVENTS_REEVALUATE, type LiftSystem } from "../rhs";
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
  const L = sys.layout;
  const n = L.n;
  const nPos = L.nPos;
  const iV = L.iV;
  const vD = iV + L.iD;
  const firstOrderFrom = L.iZ;
  const firstOrderTo = L.iWork; // Zener strains and the speed loop's integral
  const Y = st.y;
  const dY = new Float64Array(L.size);
  const hdt = 0.5 * dt;
  const dc = sys.driveControl;
  sys.rhs(st.t, Y, dY, false);
  let steps = 0;
  const t0 = st.t;
  // Prescribed drive: its speed change over [ta, tb] taken out of the chain's relative velocities exactly.
  const prescribedKick = (ta: number, tb: number) => {
    const dv = dc.prescribedVelocity(tb) - dc.prescribedVelocity(ta);
    if (dv !== 0) for (let i = 0; i < n; i++) Y[iV + i] -= dv;
    Y[iV + sys.driveNode] = 0;
    Y[vD] = dc.prescribedVelocity(tb);
  };
  for (let k = 1; k <= nSteps; k++) {
    const p0 = sys.drivePower;
    const d0 = sys.dissipation;
    const tPrev = t0 + (k - 1) * dt;
    const t = k === nSteps ? t0 + duration : t0 + k * dt;
    const prescribed = dc.prescribed;
    for (let i = firstOrderFrom; i < firstOrderTo; i++) Y[i] += dt * dY[i];
    for (let i = 0; i < nPos; i++) Y[iV + i] += hdt * dY[iV + i];
    if (prescribed) prescribedKick(tPrev, tPrev + hdt);
    for (let i = 0; i < nPos; i++) Y[i] += dt * Y[iV + i];
    Y[sys.driveNode] = 0;
    st.t = t;
    sys.rhs(t, Y, dY, false);
    Y[L.iWork] += hdt * (p0 + sys.drivePower);
    Y[L.iDiss] += hdt * (d0 + sys.dissipation);
    for (let i = 0; i < nPos; i++) Y[iV + i] += hdt * dY[iV + i];
    if (prescribed) prescribedKick(tPrev + hdt, t);
    steps++;
    const ev = sys.updateModes(t, Y);
    // A contact, a train or a drive phase that just started or ended changes the forces: re-evaluate.
    if (ev & EVENTS_REEVALUATE) sys.rhs(t, Y, dY, false);
    if (!hooks.step(st, dt, ev, false)) return { final: st, steps, timeStep: dt, endedEarly: true };
    if ((steps & 127) === 0) hooks.check(steps, t);
  }
  return { final: st, steps, timeStep: dt, endedEarly: false };
}

/** Classical RK4 over the same rhs and layout, for the benchmark's comparison. Returns the steps taken. */
export function integrateRk4(sys: LiftSystem, st: DynState, duration: number, dt: number, onStep?: (st: DynState) => void): number {
  const N = sys.layout.size;
  const y = st.y;
  const k1 = new Float64Array(N), k2 = new Float64Array(N), k3 = new Float64Array(N), k4 = new Float64Array(N);
  const tmp = new Float64Array(N);
  const nSteps = Math.ceil(duration / dt - 1e-9);
  const h = duration / nSteps;
  let t = st.t;
  for (let k = 0; k < nSteps; k++) {
    sys.rhs(t, y, k1, true);
    for (let i = 0; i < N; i++) tmp[i] = y[i] + 0.5 * h * k1[i];
    sys.rhs(t + 0.5 * h, tmp, k2, true);
    for (let i = 0; i < N; i++) tmp[i] = y[i] + 0.5 * h * k2[i];
    sys.rhs(t + 0.5 * h, tmp, k3, true);
    for (let i = 0; i < N; i++) tmp[i] = y[i] + h * k3[i];
    sys.rhs(t + h, tmp, k4, true);
    for (let i = 0; i < N; i++) y[i] += (h / 6) * (k1[i] + 2 * k2[i] + 2 * k3[i] + k4[i]);
    t += h;
    st.t = t;
    // Let the system see the accepted state (modes, diagnostics).
    sys.rhs(t, y, k1, true);
    sys.updateModes(t, y);
    onStep?.(st);
    if (!Number.isFinite(sys.maxT)) return k + 1;
  }
  return nSteps;
}
