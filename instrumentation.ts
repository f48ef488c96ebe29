/**
 * Runs once when the server starts: a production server without NEXTAUTH_SECRET refuses to start, and
 * requests are stamped with their socket address for per-address limits (lib/security/client-address.ts).
 */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME === "nodejs") {
    const { installPeerStamp } = await import("./lib/security/client-address");
    await installPeerStamp();
    const { assertAuthConfigured } = await import("./lib/auth/startup");
    assertAuthConfigured();
  }
}
