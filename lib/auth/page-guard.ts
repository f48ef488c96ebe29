import { notFound, redirect } from "next/navigation";
import { HttpError } from "@/lib/http/errors";
import { toId } from "@/lib/http/ids";
import { PAGE_ROUTES } from "./route-access";
import { can } from "./permissions";
import { isProductionInstance } from "./secret";
import { getCurrentUser, type CurrentUser } from "./session";

/**
 * The server-side check every workspace page makes, driven by the same PAGE_ROUTES table the access
 * test reads: no (valid) session → sign-in page; a role that may not see the page → 404, like a row of
 * another organisation.
 */
export async function pageUser(pattern: keyof typeof PAGE_ROUTES & string): Promise<CurrentUser> {
  const entry = PAGE_ROUTES[pattern];
  if (!entry) throw new Error(`Page ${pattern} has no entry in lib/auth/route-access.ts`);
  if (entry.nonProduction && isProductionInstance()) notFound();
  const user = await getCurrentUser();
  if (!user) redirect(`/sign-in?callbackUrl=${encodeURIComponent(pattern)}`);
  if (typeof entry.access === "object" && !can(user.role, entry.access.action)) notFound();
  return user;
}

/**
 * The row a page shows, loaded by `load` for the path's id: a malformed id, or a row the user may not see
 * (the domain function's 404), gives the not-found page.
 */
export async function pageRow<T>(params: Promise<{ id: string }>, load: (id: number) => Promise<T>): Promise<T> {
  const id = toId((await params).id);
  if (id === null) notFound();
  try {
    return await load(id);
  } catch (err) {
    if (err instanceof HttpError && err.status === 404) notFound();
    throw err;
  }
}
