"use client";
/** The side elevation's input: follows the draft while its geometry is valid, else keeps the last valid drawing. */
import { useMemo, useState } from "react";
import { liftSchema } from "@/sim/schema";
import { buildTrack } from "@/sim/track";
import type { PreviewInput } from "./LiftPreview";
import { getPath, type Draft } from "@/components/ui/form-draft";

export function useLiftPreview(draft: Draft): { previewInput: PreviewInput | null; lastPreview: PreviewInput | null } {
  const [lastPreview, setLastPreview] = useState<PreviewInput | null>(null);
  const previewInput = useMemo<PreviewInput | null>(() => {
    const g = liftSchema.safeParse(draft.lift);
    if (!g.success) return null;
    const l = g.data;
    if (!(l.chainTo > l.chainFrom)) return null;
    try {
      buildTrack(l); // the parametric fields are all there when no profile is given
    } catch {
      return null;
    }
    const num = (p: string) => (typeof getPath(draft, p) === "number" && Number.isFinite(getPath(draft, p)) ? (getPath(draft, p) as number) : undefined);
    return {
      lift: l,
      catchSpacing: num("chain.catchSpacing"),
      catchOffset: num("chain.catchOffset"),
      ard: { enabled: getPath(draft, "antiRollback.enabled") !== false, from: num("antiRollback.from") ?? 0, to: num("antiRollback.to") ?? 0 },
      takeUp: { travel: num("takeUp.travel") ?? 1, position: num("takeUp.position") ?? 0 },
      pitch: num("chain.pitch"),
      teeth: num("drive.sprocketTeeth"),
    };
  }, [draft]);
  if (previewInput && previewInput !== lastPreview) setLastPreview(previewInput);

  return { previewInput, lastPreview };
}
