/**
 * Contact geometry: catch points on the chain (material points, every catchSpacing), the ARD ratchet
 * teeth along the track, and the one-way stiff contact law they share with the take-up end stops.
 */

/**
 * Catch points as a lattice in the chain's material coordinate ξ (loop position at t = 0).
 * A loop holds n = floor(Ltot / spacing) catch points; ξ is unwrapped (any real), so catch K of lap m
 * sits at c0 + (K mod n)·spacing + m·Ltot. The gap at the wrap (if Ltot is not a multiple) is kept.
 */
export interface CatchLattice {
  count: number;
  spacing: number;
  /** Material coordinate of catch K (any integer). */
  at(K: number): number;
  /** Index of the catch point at or behind material coordinate ξ. */
  indexAtOrBehind(xi: number): number;
}

export function catchLattice(c0: number, spacing: number, loopLength: number): CatchLattice {
  const count = Math.max(1, Math.floor(loopLength / spacing + 1e-9));
  return {
    count,
    spacing,
    at(K) {
      const lap = Math.floor(K / count);
      return c0 + (K - lap * count) * spacing + lap * loopLength;
    },
    indexAtOrBehind(xi) {
      const lap = Math.floor((xi - c0) / loopLength);
      const r = xi - c0 - lap * loopLength;
      const j = Math.min(count - 1, Math.floor(r / spacing + 1e-12));
      return lap * count + j;
    },
  };
}

/** ARD ratchet: teeth at from + i·spacing, i = 0…count. */
export interface Ratchet {
  enabled: boolean;
  from: number;
  to: number;
  spacing: number;
  /** Position of the last tooth the pawl has passed, given the furthest pawl position so far; NaN if none. */
  toothBehind(pawlMax: number): number;
}

export function ratchet(enabled: boolean, from: number, to: number, spacing: number): Ratchet {
  const last = Math.floor((to - from) / spacing + 1e-9);
  return {
    enabled,
    from,
    to,
    spacing,
    toothBehind(pawlMax) {
      if (!enabled || pawlMax < from) return NaN;
      const i = Math.min(last, Math.floor((pawlMax - from) / spacing + 1e-9));
      return from + i * spacing;
    },
  };
}

/**
 * One-way contact: force k·δ + c·δ̇ while penetration δ > 0, never pulling (clamped at 0).
 * Returns the force; the elastic part is ½·k·δ² (see contactEnergy).
 */
export function contactForce(k: number, c: number, delta: number, deltaRate: number): number {
  if (delta <= 0) return 0;
  const f = k * delta + c * deltaRate;
  return f > 0 ? f : 0;
}

export function contactEnergy(k: number, delta: number): number {
  return delta > 0 ? 0.5 * k * delta * delta : 0;
}

/** Damping coefficient for a damping ratio ζ of a contact of stiffness k on mass m. */
export function contactDampingCoefficient(zeta: number, k: number, m: number): number {
  return 2 * zeta * Math.sqrt(k * m);
}
