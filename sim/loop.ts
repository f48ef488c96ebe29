/**
 * Chain loop routing and its discretisation into stations fixed in space.
 *
 * Loop coordinate q runs in the direction of chain travel:
 *   q ∈ [0, Lc)        carrying strand, track position s = chainFrom + q (up the lift)
 *   q ∈ [Lc, 2Lc)      return strand beneath it, s = chainTo − (q − Lc) (down to the drive)
 *   q ∈ [2Lc, Ltot)    bottom run: drive sprocket (q = 2Lc) → take-up sprocket (2Lc + B/2) → bottom idler (Ltot ≡ 0)
 * Segment i joins station i to station i+1 (the last one closes the loop back to station 0).
 */
import type { Scenario } from "./schema";
import type { Track } from "./track";

export interface ChainLoop {
  /** Carrying (= return) strand length Lc and the whole loop length. */
  strandLength: number;
  length: number;
  bottomRun: number;
  nodes: number;
  segments: number;
  /** Loop position of each station. */
  q: Float64Array;
  /** Natural (station-to-station) length of each segment. */
  L: Float64Array;
  /** Lumped chain mass at each station. */
  mass: Float64Array;
  /** Elevation at each segment's middle (used for the along-loop weight of the stations). */
  zMid: Float64Array;
  /** Along-loop weight on each station, N: −μ·g·(zMid_i − zMid_{i−1}); sums to zero around the loop. */
  weight: Float64Array;
  /** cos φ and signed curvature κ at each station (for the guide normal load); 0/0 on the bottom run. */
  cosPhi: Float64Array;
  kappa: Float64Array;
  /** 1 where the chain runs in guides (strands), 0 on the bottom run. */
  guided: Uint8Array;
  /** Elevation of each station (for display and energy). */
  z: Float64Array;
  /** Station indices. */
  topNode: number;
  driveNode: number;
  /** Station at (or, for an odd bottom run, just before) the take-up sprocket. */
  takeUpNode: number;
  /**
   * Segments the take-up drop y lengthens, with their weight: two legs × 1 when the take-up sits on a
   * station, or one central segment × 2 when the bottom run has an odd number of segments (a frictionless
   * take-up sprocket carries the same tension on both legs, so one segment with 2·y is exact for it).
   */
  legs: { seg: number; weight: number }[];
  /** Carrying strand: stations 0…nsStrand, uniformly spaced by hStrand. */
  nsStrand: number;
  hStrand: number;
  /** Bottom-run elevation (the level of chainFrom). */
  zBottom: number;
}

/** Track position of a loop position on either strand (bottom run returns chainFrom). */
export function trackPositionOf(Lc: number, chainFrom: number, q: number): number {
  if (q < Lc) return chainFrom + q;
  if (q < 2 * Lc) return chainFrom + Lc - (q - Lc);
  return chainFrom;
}

/**
 * Segments per strand (ns) and on the bottom run (nbt) for N segments round the loop: the bottom run gets
 * segments about as long as the rest (at least one); the strands share the others. The total is N, or N + 1
 * when a single bottom-run segment leaves an odd number for the two strands.
 */
export function meshCounts(strandLength: number, bottomRun: number, segments: number): { ns: number; nbt: number } {
  const N = Math.max(4, Math.round(segments));
  const h = (2 * strandLength + bottomRun) / N;
  let nbt = Math.max(1, Math.round(bottomRun / h));
  if ((N - nbt) % 2 !== 0 && nbt > 1) nbt -= 1;
  const ns = Math.max(2, Math.ceil((N - nbt) / 2));
  return { ns, nbt };
}

export function buildLoop(s: Scenario, track: Track, segmentsOverride?: number): ChainLoop {
  const Lc = s.lift.chainTo - s.lift.chainFrom;
  const B = s.lift.bottomRun;
  const Ltot = 2 * Lc + B;
  const { ns, nbt } = meshCounts(Lc, B, segmentsOverride ?? s.run.segments);
  const n = 2 * ns + nbt;
  const q = new Float64Array(n);
  for (let j = 0; j < ns; j++) q[j] = (Lc * j) / ns;
  for (let j = 0; j < ns; j++) q[ns + j] = Lc + (Lc * j) / ns;
  for (let j = 0; j < nbt; j++) q[2 * ns + j] = 2 * Lc + (B * j) / nbt;
  const L = new Float64Array(n);
  for (let i = 0; i < n; i++) L[i] = (i + 1 < n ? q[i + 1] : Ltot) - q[i];

  const from = s.lift.chainFrom;
  const zBottom = track.elevation(from);
  const zOf = (qq: number) => (qq >= 2 * Lc ? zBottom : track.elevation(trackPositionOf(Lc, from, qq)));
  const zMid = new Float64Array(n);
  const z = new Float64Array(n);
  const cosPhi = new Float64Array(n);
  const kappa = new Float64Array(n);
  const guided = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    zMid[i] = zOf(q[i] + L[i] / 2);
    z[i] = zOf(q[i]);
    if (q[i] < 2 * Lc) {
      const sp = trackPositionOf(Lc, from, q[i]);
      cosPhi[i] = Math.cos(track.slope(sp));
      kappa[i] = track.curvature(sp);
      guided[i] = 1;
    }
  }
  // The top and drive stations sit on sprockets/idlers, not in guides.
  guided[ns] = 0;
  guided[2 * ns] = 0;
  guided[0] = 0;
  const mu = s.chain.massPerLength;
  const g = s.run.gravity;
  const mass = new Float64Array(n);
  const weight = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const prev = (i - 1 + n) % n;
    mass[i] = (mu * (L[prev] + L[i])) / 2;
    weight[i] = -mu * g * (zMid[i] - zMid[prev]);
  }
  const half = Math.floor(nbt / 2);
  const takeUpNode = 2 * ns + half;
  const legs =
    nbt % 2 === 0
      ? [
          { seg: takeUpNode - 1, weight: 1 },
          { seg: takeUpNode, weight: 1 },
        ]
      : [{ seg: takeUpNode, weight: 2 }];
  return {
    strandLength: Lc,
    length: Ltot,
    bottomRun: B,
    nodes: n,
    segments: n,
    q,
    L,
    mass,
    zMid,
    weight,
    cosPhi,
    kappa,
    guided,
    z,
    topNode: ns,
    driveNode: 2 * ns,
    takeUpNode,
    legs,
    nsStrand: ns,
    hStrand: Lc / ns,
    zBottom,
  };
}

/**
 * Strain of each segment in the static equilibrium at t = 0: the take-up carries half its weight in
 * each leg, and going round the loop the tension grows with height by the chain's own weight
 * (T_i − T_{i−1} = μ·g·(zMid_i − zMid_{i−1}), the exact equilibrium of the lumped stations).
 */
export function staticStrain(loop: ChainLoop, takeUpMass: number, mu: number, g: number, EA: number): Float64Array {
  const eps0 = new Float64Array(loop.segments);
  const T0 = (takeUpMass * g) / 2;
  for (let i = 0; i < loop.segments; i++) eps0[i] = (T0 + mu * g * (loop.zMid[i] - loop.zBottom)) / EA;
  return eps0;
}
