import { withAuth } from "next-auth/middleware";
import { authSecret } from "@/lib/auth/secret";

/**
 * Sends visitors without a session to the sign-in page before a workspace page renders.
 * This is only the first gate: every page and route handler checks the session and role on the server
 * (lib/auth/session.ts), because the token here is not re-checked against the database.
 */
export default withAuth({
  pages: { signIn: "/sign-in" },
  secret: secretOrUndefined(),
});

// Without a secret in production next-auth rejects every token here, and instrumentation.ts stops the server.
function secretOrUndefined(): string | undefined {
  try {
    return authSecret();
  } catch {
    return undefined;
  }
}

// Workspace pages only (one line per top-level folder of app/(workspace); the access test checks this);
// API routes answer 401 themselves and public pages stay open.
export const config = {
  matcher: [
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
  ],
};
