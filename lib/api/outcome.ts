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
