import { NextResponse, type NextFetchEvent, type NextRequest } from "next/server";
import { withAuth } from "next-auth/middleware";
import { authSecret } from "@/lib/auth/secret";
import { newNonce, pageCsp } from "@/lib/security/headers";

/**
 * Sends visitors without a session to the sign-in page before a workspace page renders.
 * This is only the first gate: every page and route handler checks the session and role on the server
 * (lib/auth/session.ts), because the token here is not re-checked against the database.
 */
const guard = withAuth((req) => withNonce(req), {
  pages: { signIn: "/sign-in" },
  secret: secretOrUndefined(),
});

export default function proxy(req: NextRequest, event: NextFetchEvent) {
  const path = req.nextUrl.pathname;
  if (WORKSPACE.some((p) => path === p || path.startsWith(`${p}/`))) return guard(req as Parameters<typeof guard>[0], event);
  return withNonce(req);
}

/**
 * Every page gets a Content-Security-Policy with a fresh nonce: Next reads it from the request header
 * and puts it on its own scripts, so no inline script runs without it (lib/security/headers.ts).
 */
function withNonce(req: NextRequest): NextResponse {
  const csp = pageCsp(newNonce());
  const headers = new Headers(req.headers);
  headers.set("Content-Security-Policy", csp);
  const res = NextResponse.next({ request: { headers } });
  res.headers.set("Content-Security-Policy", csp);
  return res;
}

// Without a secret in production next-auth rejects every token here, and instrumentation.ts stops the server.
function secretOrUndefined(): string | undefined {
  try {
    return authSecret();
  } catch {
    return undefined;
  }
}

// Workspace pages that need a session (one line per top-level folder of app/(workspace); the access test
// checks this); API routes answer 401 themselves and public pages stay open.
const WORKSPACE_MATCHERS = [
  "/dashboard/:path*",
  "/lifts/:path*",
  "/trains/:path*",
  "/scenarios/:path*",
  "/studies/:path*",
  "/logbook/:path*",
  "/replays/:path*",
  "/runs/:path*",
  "/settings/:path*",
  "/admin/:path*",
  "/reports/:path*",
  "/audit/:path*",
];
const WORKSPACE = WORKSPACE_MATCHERS.map((m) => m.replace("/:path*", ""));

// Every page (for the CSP nonce); API routes, build assets and files with an extension are left alone.
export const config = {
  matcher: ["/((?!api/|_next/|.*\\.[a-zA-Z0-9]+$).*)"],
};
