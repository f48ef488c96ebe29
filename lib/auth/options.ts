import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { authSecret } from "./secret";
import { checkCredentials, RATE_LIMITED_ERROR } from "./sign-in";
import { claimedAddress, clientAddress } from "@/lib/security/client-address";
import { safeCallbackPath } from "@/lib/security/redirect";

const SESSION_HOURS = 12;

let cached: NextAuthOptions | undefined;

/**
 * next-auth options, built on first use so that `next build` can import route modules without a secret,
 * while a production server without NEXTAUTH_SECRET refuses to serve (see instrumentation.ts).
 *
 * The JWT carries only the user id (`uid`) and session version (`sv`); role, organisation and the active
 * flag are read from the database on every request by lib/auth/session.ts.
 */
export function getAuthOptions(): NextAuthOptions {
  cached ??= {
    secret: authSecret(),
    session: { strategy: "jwt", maxAge: SESSION_HOURS * 3600 },
    pages: { signIn: "/sign-in", error: "/sign-in" },
    providers: [
      CredentialsProvider({
        id: "credentials",
        name: "Tautline account",
        credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
        async authorize(credentials, req) {
          const headers = req.headers ?? {};
          const result = await checkCredentials(credentials ?? {}, { address: clientAddress(headers), claimed: claimedAddress(headers) });
          if (result.ok) {
            const u = result.user;
            return { id: String(u.id), email: u.email, name: u.name, uid: u.id, sv: u.sessionVersion };
          }
          // next-auth turns a thrown error's message into `?error=` on the redirect.
          if (result.reason === "rate-limited") throw new Error(RATE_LIMITED_ERROR);
          return null;
        },
      }),
    ],
    events: {
      // A JWT cannot be recalled, so signing out moves the account's session version on: the token just
      // cleared from this browser (and any copy of it) stops working at its next request. Like a password
      // change, this ends the account's other sessions too.
      async signOut({ token }) {
        const uid = Number(token?.uid);
        const sv = Number(token?.sv);
        if (!Number.isInteger(uid) || !Number.isInteger(sv)) return;
        const { getModels } = await import("@/models");
        const { User } = getModels();
        await User.update({ sessionVersion: sv + 1 }, { where: { id: uid, sessionVersion: sv } });
      },
    },
    callbacks: {
      // next-auth's own redirects (after sign-in and sign-out) stay on this site, by the same rule as the sign-in page.
      async redirect({ url, baseUrl }) {
        if (url.startsWith(baseUrl)) url = url.slice(baseUrl.length) || "/";
        return `${baseUrl}${safeCallbackPath(url)}`;
      },
      async jwt({ token, user }) {
        if (user) {
          const u = user as unknown as { uid: number; sv: number };
          token.uid = u.uid;
          token.sv = u.sv;
        }
        return token;
      },
      async session({ session, token }) {
        return { ...session, uid: token.uid as number | undefined, sv: token.sv as number | undefined };
      },
    },
  };
  return cached;
}
