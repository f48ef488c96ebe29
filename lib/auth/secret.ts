/** Used only outside production so a fresh checkout signs in without setup. Never valid in production. */
const DEVELOPMENT_SECRET = "tautline-development-secret-not-for-production";

export class MissingSecretError extends Error {
  constructor() {
    super(
      "NEXTAUTH_SECRET is not set. In production Tautline refuses to run without it: " +
        "set NEXTAUTH_SECRET to a long random string (e.g. `openssl rand -base64 32`).",
    );
    this.name = "MissingSecretError";
  }
}

/** The secret that signs session tokens; throws in production when none is configured. */
export function authSecret(env: Readonly<Record<string, string | undefined>> = process.env): string {
  const secret = env.NEXTAUTH_SECRET || env.AUTH_SECRET;
  if (secret) return secret;
  if (env.NODE_ENV === "production") throw new MissingSecretError();
  return DEVELOPMENT_SECRET;
}

/**
 * A live deployment, as opposed to a demo, development or test instance. `next start` always runs with
 * NODE_ENV=production, so the deployment says so itself with TAUTLINE_ENV=production; development tools
 * (the mailbox page) then answer 404.
 */
export function isProductionInstance(env: Readonly<Record<string, string | undefined>> = process.env): boolean {
  return env.TAUTLINE_ENV === "production";
}
