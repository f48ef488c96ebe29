/**
 * Mesh confidence in a reader's words: "converged", or which figure moves how much at the coarser mesh and which
 * verdict changes. Pure; the run view and the study table use it (the figures come from sim/confidence.ts).
 */
import type { MeshConfidence } from "@/sim/confidence";

/** Names of the figures sim/confidence.ts compares, as the headline figures call them. */
export const MESH_FIGURE_LABELS: Record<string, string> = {
  peakTension: "peak tension",
  peakDriveTension: "peak drive tension",
  steadyTension: "steady tension",
  snatchFactor: "snatch factor",
  peakDogForce: "peak dog force",
  peakArdForce: "peak ARD force",
  rollbackDistance: "rollback",
  takeUpMaxDrop: "take-up drop",
  takeUpCreepRate: "take-up creep rate",
  peakRiderAccel: "peak rider acceleration",
  timeToChainSpeed: "time to chain speed",
  pickupDelay: "load pick-up delay",
};

/** The run's stored mesh confidence (`diagnostics.meshConfidence`), or null when the run holds none. */
export function meshConfidenceOf(diagnostics: Record<string, unknown> | null | undefined): MeshConfidence | null {
  const mc = diagnostics?.meshConfidence as MeshConfidence | null | undefined;
  return mc && typeof mc.converged === "boolean" && Array.isArray(mc.figures) ? mc : null;
}

export interface MeshLine {
  converged: boolean;
  /** "converged" or "not converged: peak tension moves 3.1 % at a coarser mesh; …". */
  text: string;
  /** Which meshes were compared. */
  detail: string;
}

export function meshLine(mc: MeshConfidence): MeshLine {
  const detail = `${mc.fineSegments} segments against ${mc.coarseSegments}; a figure counts as converged within ${(mc.tolerance * 100).toFixed(0)} %.`;
  if (mc.converged) return { converged: true, text: "converged", detail };
  const parts: string[] = [];
  for (const f of mc.figures) {
    if (f.converged) continue;
    const name = MESH_FIGURE_LABELS[f.key] ?? f.key;
    if (f.relativeChange !== null) parts.push(`${name} moves ${(f.relativeChange * 100).toFixed(1)} % at a coarser mesh`);
    else if (f.fine === null) parts.push(`${name} is empty here but not at a coarser mesh`);
    else if (f.coarse === null) parts.push(`${name} is empty at a coarser mesh`);
    else parts.push(`${name} is 0 here but not at a coarser mesh`);
  }
  for (const v of mc.flipped) parts.push(`${v.label}: ${v.fine} here, ${v.coarse} at the coarser mesh`);
  if (mc.marginal.length) parts.push(`within the mesh error of its limit: ${mc.marginal.join(", ")}`);
  return { converged: false, text: `not converged: ${parts.join("; ")}`, detail };
}
