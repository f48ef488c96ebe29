"use client";
/** Whether a saved run's headline figures hold at a coarser mesh (stored by the engine worker with the run). */
import { meshLine } from "@/lib/runs/mesh";
import type { MeshConfidence } from "@/sim";
import { cx } from "@/components/ui/cx";

export function MeshConfidenceNote({ confidence, error }: { confidence: MeshConfidence | null | undefined; error?: string | null }) {
  if (!confidence && error)
    return (
      <p data-testid="mesh-confidence" data-converged="unknown" className="text-[12.5px] font-semibold text-[#7a5400]">
        <span>Mesh: </span>not checked against a coarser mesh ({error}).
      </p>
    );
  if (!confidence) return null;
  const line = meshLine(confidence);
  return (
    <p
      data-testid="mesh-confidence"
      data-converged={line.converged}
      className={cx("text-[12.5px]", line.converged ? "text-ink-800" : "font-semibold text-[#7a5400]")}
      title={line.detail}
    >
      <span className="font-semibold">Mesh: </span>
      {line.text}
      <span className="ml-2 font-normal text-steel-500">({line.detail})</span>
    </p>
  );
}
