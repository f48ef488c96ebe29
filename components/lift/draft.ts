/** A lift form's draft from a lift (or the new-lift template), and the request body a draft becomes. */
import { CHAIN_VALUE_FIELDS } from "./fields";
import type { Draft } from "@/components/ui/form-draft";
import type { LiftJson } from "./types";

export type Mode = { kind: "new" } | { kind: "edit"; lift: LiftJson };

export function draftOf(mode: Mode, template: Draft): Draft {
  if (mode.kind === "new") return structuredClone(template);
  const r = mode.lift.currentRevision;
  return structuredClone({
    name: r.name,
    site: r.site ?? "",
    notes: r.notes ?? "",
    chainSpecId: r.chainSpecId,
    lift: r.lift,
    chain: r.chain,
    drive: r.drive,
    takeUp: r.takeUp,
    antiRollback: r.antiRollback,
    limits: r.limits,
  });
}

/** The request body: the chain as the API takes it (catalogue id, or the chain's own values). */
export function bodyOf(d: Draft, changeSummary: string): Record<string, unknown> {
  const chain = { ...(d.chain as Record<string, unknown>) };
  const specId = d.chainSpecId as number | null;
  const chainBody = specId
    ? Object.fromEntries([["chainSpecId", specId], ...Object.entries(chain).filter(([k]) => !CHAIN_VALUE_FIELDS.some((f) => f.path === `chain.${k}`))])
    : { ...chain, chainSpecId: null };
  return {
    name: d.name,
    site: d.site || null,
    notes: d.notes || null,
    ...(changeSummary.trim() ? { changeSummary: changeSummary.trim() } : {}),
    lift: d.lift,
    chain: chainBody,
    drive: d.drive,
    takeUp: d.takeUp,
    antiRollback: d.antiRollback,
    limits: d.limits,
  };
}
