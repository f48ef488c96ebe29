/**
 * The state at t = 0: the joint static equilibrium of chain, take-up, trains and ARD.
 *
 * - A train present at t = 0 standing still (entrySpeed 0) with its dog on, or within ENGAGE_TOLERANCE of, a
 *   catch point starts engaged: it hangs on that catch with its weight component (rolling resistance is not
 *   engaged at rest), the contact compressed by F/k.
 * - Otherwise a standing train with a tooth within one spacing behind a pawl starts settled on the first tooth
 *   its pawls would meet rolling back (F/k into the contact), as version 1 did.
 * - The chain carries the take-up's m·g/2 in each leg plus its own weight (staticStrain), and every hanging
 *   train's load F on the segments from its catch forward to the drive (the drive, held, takes it; the legs
 *   and so the take-up keep their tension). The added stretch Σ ΔT·L/(E·A) lengthens the loop: the weight
 *   drops by half of it.
 * - The chain stands still: relative to the drive, ẇ = −v_d(0) (non-zero only for a sudden start of an ideal
 *   drive). The Zener arms start relaxed.
 */
import { newState, type DynState } from "./integrators/types";
import type { LiftSystem } from "./rhs";

/** A standing dog this close to a catch point starts engaged, m. */
export const ENGAGE_TOLERANCE = 0.001;

export function initialState(sys: LiftSystem, notes: string[]): DynState {
  const L = sys.layout;
  const st = newState(L);
  const Y = st.y;
  const loop = sys.loop;
  const n = sys.n;
  const hanging: { j: number; K: number; F: number; q: number }[] = [];
  for (let j = 0; j < sys.trains.length; j++) {
    const tr = sys.trains[j];
    const ts = tr.settings;
    Y[L.iX + j] = ts.startPosition;
    if (ts.startTime > 0) continue;
    sys.appear(j, Y, 0);
    if (ts.entrySpeed !== 0) continue;
    const x = ts.startPosition;
    const back = -tr.model.force(x, 0);
    // Dog on a catch point?
    if (sys.dogInZone(x, tr.dogOffset)) {
      const xi = x - tr.dogOffset - sys.chainFrom; // material = position at t = 0 before any stretch
      const Kb = sys.lattice.indexAtOrBehind(xi);
      const gapBehind = xi - sys.lattice.at(Kb);
      const gapAhead = sys.lattice.at(Kb + 1) - xi;
      const K = gapBehind <= ENGAGE_TOLERANCE ? Kb : gapAhead <= ENGAGE_TOLERANCE ? Kb + 1 : NaN;
      if (K === K) {
        hanging.push({ j, K, F: Math.max(0, back), q: sys.lattice.at(K) });
        notes.push(`Train ${j + 1} starts engaged on the catch point at ${(sys.lattice.at(K) + sys.chainFrom).toFixed(3)} m, hanging on the chain.`);
        continue;
      }
    }
    // Settled on the ARD: the first tooth a pawl meets rolling back.
    if (back > 0 && sys.ratchet.enabled) {
      let drop = Infinity;
      let at = NaN;
      for (let k = 0; k < tr.pawls.length; k++) {
        const p = x - tr.pawls[k];
        const tooth = sys.ratchet.toothBehind(p);
        if (tooth === tooth && p - tooth <= sys.s.antiRollback.toothSpacing && p - tooth < drop) {
          drop = p - tooth;
          at = tooth;
        }
      }
      if (drop < Infinity) {
        const nx = x - drop - back / sys.ardStiffness; // the pawls keep the teeth they passed at x
        Y[L.iX + j] = nx;
        notes.push(
          `Train ${j + 1} starts at rest on the ARD tooth at ${at.toFixed(3)} m (front at ${nx.toFixed(3)} m, ${(drop * 1000).toFixed(1)} mm back from its start position).`,
        );
      }
    }
  }
  // Chain statics with the hanging trains: ΔT = F on the segments from each catch forward to the drive.
  const dT = new Float64Array(n);
  const h = loop.hStrand;
  for (const hg of hanging) {
    let js = Math.floor(hg.q / h);
    if (js < 0) js = 0;
    else if (js >= loop.nsStrand) js = loop.nsStrand - 1;
    const f = hg.q / h - js;
    dT[js] += hg.F * (1 - f);
    for (let i = js + 1; i !== sys.driveNode; i = i + 1 < n ? i + 1 : 0) dT[i] += hg.F;
  }
  let stretch = 0;
  for (let i = 0; i < n; i++) stretch += (dT[i] * loop.L[i]) / sys.EA;
  const y = stretch / 2; // each unit the weight drops lengthens the loop by 2
  Y[L.iY] = y;
  const d = sys.driveNode;
  Y[d] = 0;
  for (let c = 0, i = d; c < n - 1; c++, i = i + 1 < n ? i + 1 : 0) {
    const k = i + 1 < n ? i + 1 : 0;
    Y[k] = Y[i] + (dT[i] * loop.L[i]) / sys.EA - sys.legY[i] * y;
  }
  // Hanging trains sit on their catch, compressed by F/k.
  for (const hg of hanging) {
    const tr = sys.trains[hg.j];
    const qk = sys.catchPosition(Y, hg.K, hg.q);
    Y[L.iX + hg.j] = qk - hg.F / sys.dogStiffness + tr.dogOffset + sys.chainFrom;
    tr.engaged = hg.K;
    tr.engageOffset = 0;
    tr.lastCatchIndex = hg.K - 1;
    sys.placePawls(tr, Y[L.iX + hg.j], false);
  }
  // Drive speed at t = 0 and the chain at rest.
  const dc = sys.driveControl;
  const vd0 = dc.prescribed ? dc.prescribedVelocity(0) : 0;
  Y[L.iV + L.iD] = vd0;
  for (let i = 0; i < n; i++) Y[L.iV + i] = i === d ? 0 : -vd0;
  // Zener arms relaxed at the initial strains.
  if (L.nZ > 0) {
    for (let i = 0; i < n; i++) {
      const k = i + 1 < n ? i + 1 : 0;
      Y[L.iZ + i] = sys.eps0[i] + (Y[k] - Y[i] + sys.legY[i] * y) * sys.invL[i];
    }
  }
  if (sys.latticeGap > 1e-6)
    notes.push(
      `The loop (${loop.length.toFixed(2)} m) is not a whole number of catch spacings: the two catch points half a loop from chain.catchOffset are ${(sys.s.chain.catchSpacing + sys.latticeGap).toFixed(3)} m apart.`,
    );
  return st;
}
