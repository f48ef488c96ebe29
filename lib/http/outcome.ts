// What DELETE does: rows others depend on are archived (readable, not editable) instead of removed; restoring un-archives.
import { conflict } from "@/lib/http/errors";

export interface DeleteOutcome {
  id: number;
  /** "archived" when other rows still depend on it (it stays readable), else "deleted". */
  outcome: "deleted" | "archived";
}

/** Archived rows stay readable (old scenarios and runs point at them) but are not edited any more. */
export function assertNotArchived(row: { archivedAt: Date | null }, what: string): void {
  if (row.archivedAt) throw conflict(`This ${what} is archived; archived ${what}s are kept as they are.`);
}

/**
 * `{ version, archived: false }` sent to an archived row brings it back: the one edit an archived row takes.
 * (Archiving is what DELETE does to a row that others depend on.)
 */
export function isRestoreRequest(input: unknown): input is { version: number; archived: false } {
  if (typeof input !== "object" || input === null || Array.isArray(input)) return false;
  const o = input as Record<string, unknown>;
  return (
    Object.keys(o).sort().join(",") === "archived,version" &&
    o.archived === false &&
    typeof o.version === "number" &&
    Number.isInteger(o.version)
  );
}
