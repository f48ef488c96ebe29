/** What changed between two lift revisions, in the order a reader expects the fields. */
import { diffValues, type FieldChange } from "@/lib/diff/values";

export type { FieldChange };

/** The revision fields a user edits, in the order a reader expects them. */
const REVISION_FIELDS = ["name", "site", "notes", "chainSpecId", "lift", "chain", "drive", "takeUp", "antiRollback", "limits"] as const;

type RevisionLike = Partial<Record<(typeof REVISION_FIELDS)[number], unknown>>;

/** What changed from revision `a` to revision `b` (e.g. "lift.angle": 40 → 38). */
export function diffRevisions(a: RevisionLike, b: RevisionLike): FieldChange[] {
  return REVISION_FIELDS.flatMap((f) => diffValues(a[f], b[f], f));
}
