import { can, type Action } from "@/lib/auth/permissions";
import type { CurrentUser } from "@/lib/auth/current-user";
import { forbidden, notFound } from "@/lib/http/errors";

/** What domain functions need to know about who acts: the requireUser() shape, or a subset of it. */
export type Actor = Pick<CurrentUser, "id" | "organisationId" | "role">;

/** Throws 403 unless the actor's role may do `action`. */
export function assertCan(actor: Actor, action: Action): void {
  if (!can(actor.role, action)) throw forbidden();
}

/**
 * Another organisation's row answers exactly like a missing one (404), so nobody learns it exists.
 * Rows with `organisationId === null` (the shared standard catalogue) pass when `allowShared` is set.
 */
export function ownOr404<T extends { organisationId: number | null }>(
  row: T | null | undefined,
  actor: Actor,
  what: string,
  allowShared = false,
): T {
  if (!row) throw notFound(`${what} not found.`);
  if (row.organisationId === null && allowShared) return row;
  if (row.organisationId !== actor.organisationId) throw notFound(`${what} not found.`);
  return row;
}
