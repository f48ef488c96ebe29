// The signed-in user on the server: reads the session and re-checks the user row on every request (requireUser, requirePermission).
import { cookies } from "next/headers";
import { forbidden, unauthorized } from "@/lib/http/errors";
import { getModels } from "@/models";
import { readCacheMaxAgeMs } from "@/lib/http/read-cache";
import { cachesUsable, currentTick, noteDatabaseAnswered, stampOf, writtenSince } from "@/lib/db/change-tracker";
import { isRole } from "./roles";
import { can, type Action } from "./permissions";
import { getAuthOptions } from "./options";
import { readSessionClaims, sessionTokenFrom } from "./session-token";
import type { CurrentUser } from "./current-user";

export type { CurrentUser } from "./current-user";

/**
 * Loads the signed-in user for a server component, server action or route handler.
 * The session token only names the user; the row is read again on every call, so a deactivated user,
 * a changed role or a changed password (session version) takes effect on the very next request.
 * The token is read straight from the cookie (not through getServerSession, which would also re-encrypt a
 * refreshed token that a route handler then throws away).
 */
export async function getCurrentUser(): Promise<CurrentUser | null> {
  const jar = new Map((await cookies()).getAll().map((c) => [c.name, c.value] as const));
  const session = await readSessionClaims(sessionTokenFrom(jar), getAuthOptions().secret!);
  if (!session?.uid) return null;
  return loadActiveUser(session.uid, session.sv);
}

// The user row of each recent session, reused until the users table is written (any change to any user,
// made by this process, invalidates them all; lib/db/change-tracker.ts) or a few seconds pass, which bounds
// how long a change made outside the app (SQL by hand) takes to apply.
// READ_CACHE_MS=0 (several app servers on one database) turns this off too.
const USER_ROW_MAX_AGE_MS = Math.min(5_000, readCacheMaxAgeMs());
const userRows = new Map<number, KnownUser>();

/** The user row behind a session claim, or null if it is gone, inactive or its session was revoked. */
export async function loadActiveUser(id: number, sessionVersion: number | undefined): Promise<CurrentUser | null> {
  let known = userRows.get(id);
  if (!known || !cachesUsable() || Date.now() - known.at >= USER_ROW_MAX_AGE_MS || known.stamp !== stampOf(USERS)) known = await readUserRow(id);
  if (!known.user) return null;
  if (sessionVersion !== undefined && known.sessionVersion !== sessionVersion) return null;
  return { ...known.user };
}

type KnownUser = { user: CurrentUser | null; sessionVersion: number | null; stamp: string; at: number };
// One read per user at a time: when the cached row expires under load, every waiting request shares it.
const readingRows = new Map<number, { since: number; row: Promise<KnownUser> }>();

function readUserRow(id: number): Promise<KnownUser> {
  const inFlight = readingRows.get(id);
  // Joined only if no user row changed since it started, so nobody gets a row older than their request.
  if (inFlight && !writtenSince(USERS, inFlight.since)) return inFlight.row;
  const since = currentTick();
  const row = (async () => {
    const { User } = getModels();
    const r = await User.findByPk(id, { raw: true });
    noteDatabaseAnswered();
    const user: CurrentUser | null =
      r && r.active && r.passwordHash && isRole(r.role)
        ? { id: r.id, organisationId: r.organisationId, role: r.role, email: r.email, name: r.name, units: r.units }
        : null;
    const known: KnownUser = { user, sessionVersion: r?.sessionVersion ?? null, stamp: stampOf(USERS), at: Date.now() };
    if (!writtenSince(USERS, since)) {
      if (userRows.size >= 5_000) userRows.delete(userRows.keys().next().value!);
      userRows.set(id, known);
    }
    return known;
  })().finally(() => {
    if (readingRows.get(id)?.row === row) readingRows.delete(id);
  });
  readingRows.set(id, { since, row });
  return row;
}

const USERS = ["users"];

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
