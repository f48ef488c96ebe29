import { getServerSession } from "next-auth/next";
import { forbidden, notFound, unauthorized } from "@/lib/http/errors";
import { getModels } from "@/models";
import { isRole } from "./roles";
import { can, type Action } from "./permissions";
import { getAuthOptions } from "./options";
import type { CurrentUser } from "./current-user";

export type { CurrentUser } from "./current-user";

interface SessionClaims {
  uid?: number;
  sv?: number;
}

/**
 * Loads the signed-in user for a server component, server action or route handler.
 * The session token only names the user; the row is read again on every call, so a deactivated user,
 * a changed role or a changed password (session version) takes effect on the very next request.
 */
export async function getCurrentUser(): Promise<CurrentUser | null> {
  const session = (await getServerSession(getAuthOptions())) as (SessionClaims & object) | null;
  if (!session?.uid) return null;
  return loadActiveUser(session.uid, session.sv);
}

/** The user row behind a session claim, or null if it is gone, inactive or its session was revoked. */
export async function loadActiveUser(id: number, sessionVersion: number | undefined): Promise<CurrentUser | null> {
  const { User } = getModels();
  const row = await User.findByPk(id);
  if (!row || !row.active || !row.passwordHash) return null;
  if (sessionVersion !== undefined && row.sessionVersion !== sessionVersion) return null;
  if (!isRole(row.role)) return null;
  return {
    id: row.id,
    organisationId: row.organisationId,
    role: row.role,
    email: row.email,
    name: row.name,
    units: row.units,
  };
}

/**
 * For public pages that only adapt to a session (landing, sign-in): a database outage there reads as
 * "not signed in" instead of breaking the page. Protected code uses getCurrentUser/requireUser.
 */
export async function getCurrentUserIfAvailable(): Promise<CurrentUser | null> {
  try {
    return await getCurrentUser();
  } catch (err) {
    console.error("session check:", (err as Error).message);
    return null;
  }
}

/** The signed-in user, or an HttpError 401. */
export async function requireUser(): Promise<CurrentUser> {
  const user = await getCurrentUser();
  if (!user) throw unauthorized();
  return user;
}

/** The signed-in user if their role may do `action`; otherwise HttpError 401 (no session) or 403. */
export async function requirePermission(action: Action): Promise<CurrentUser> {
  const user = await requireUser();
  if (!can(user.role, action)) throw forbidden();
  return user;
}

/** Where-clause fragment that keeps a query inside the user's organisation. */
export function scopeToOrg(user: Pick<CurrentUser, "organisationId">): { organisationId: number } {
  return { organisationId: user.organisationId };
}

/**
 * Guards a row loaded by id: missing rows and rows of another organisation both answer 404,
 * so nobody learns that another organisation's row exists.
 */
export function ownRowOr404<T extends { organisationId: number }>(
  row: T | null | undefined,
  user: Pick<CurrentUser, "organisationId">,
  what = "Not found.",
): T {
  if (!row || row.organisationId !== user.organisationId) throw notFound(what);
  return row;
}
