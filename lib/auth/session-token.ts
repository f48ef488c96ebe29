import { decode } from "next-auth/jwt";

/** What our session token carries (lib/auth/options.ts puts only these in it). */
export interface SessionClaims {
  uid?: number;
  sv?: number;
}

// next-auth's own names: the __Secure- prefix when the site runs on https (its useSecureCookies default).
export function sessionCookieName(env: Readonly<Record<string, string | undefined>> = process.env): string {
  return env.NEXTAUTH_URL?.startsWith("https://") ? "__Secure-next-auth.session-token" : "next-auth.session-token";
}

/** The token from the request's cookies, joining next-auth's chunks (`name.0`, `name.1`, …) when it split one. */
export function sessionTokenFrom(cookies: ReadonlyMap<string, string>, name = sessionCookieName()): string | null {
  const whole = cookies.get(name);
  if (whole) return whole;
  const chunks = [...cookies.entries()]
    .filter(([k]) => k.startsWith(`${name}.`) && /^\d+$/.test(k.slice(name.length + 1)))
    .sort(([a], [b]) => Number(a.slice(name.length + 1)) - Number(b.slice(name.length + 1)))
    .map(([, v]) => v);
  return chunks.length ? chunks.join("") : null;
}

const MAX_CACHED = 2_000;
// Decrypting a token costs a key derivation and an AES-GCM open on every request, which dominated the
// request time under load. A token string never changes, so what it decrypts to can be remembered until the
// token expires; whether its user may still act is decided by the database row on every request.
const decoded = new Map<string, { claims: SessionClaims; expiresAt: number }>();

/** The claims of a valid, unexpired token; null for a missing, forged or expired one. */
export async function readSessionClaims(token: string | null, secret: string, now = Date.now()): Promise<SessionClaims | null> {
  if (!token) return null;
  const hit = decoded.get(token);
  if (hit) {
    if (hit.expiresAt > now) return hit.claims;
    decoded.delete(token);
    return null;
  }
  let payload: Record<string, unknown> | null;
  try {
    payload = (await decode({ token, secret })) as Record<string, unknown> | null;
  } catch {
    return null; // tampered, encrypted with another secret, or expired (jose checks exp)
  }
  if (!payload || typeof payload.exp !== "number") return null;
  const claims: SessionClaims = {
    uid: typeof payload.uid === "number" ? payload.uid : undefined,
    sv: typeof payload.sv === "number" ? payload.sv : undefined,
  };
  if (decoded.size >= MAX_CACHED) decoded.delete(decoded.keys().next().value!);
  decoded.set(token, { claims, expiresAt: payload.exp * 1000 });
  return claims;
}
