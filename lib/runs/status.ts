/** Run states (Tautline's own words; see RULES.md). Kept free of server imports so screens can use them. */
export const RUN_STATUSES = ["queued", "running", "done", "failed", "cancelled"] as const;
export type RunStatus = (typeof RUN_STATUSES)[number];

export const ACTIVE_RUN_STATUSES = ["queued", "running"] as const satisfies readonly RunStatus[];
export const FINISHED_RUN_STATUSES = ["done", "failed", "cancelled"] as const satisfies readonly RunStatus[];

export function isFinished(status: RunStatus): boolean {
  return (FINISHED_RUN_STATUSES as readonly RunStatus[]).includes(status);
}
