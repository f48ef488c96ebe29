/**
 * Runs once when the server starts: a production server without NEXTAUTH_SECRET refuses to start, and
 * requests are stamped with their socket address for per-address limits (lib/security/client-address.ts), and
 * jobs interrupted by the previous server's end are recovered (in the background, off the request path).
 */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME === "nodejs") {
    const { installPeerStamp } = await import("./lib/security/client-address");
    await installPeerStamp();
    const { assertAuthConfigured } = await import("./lib/auth/startup");
    assertAuthConfigured();
    if (process.env.NEXT_PHASE === "phase-production-build") return;
    const { recoverAtStartup } = await import("./lib/engine/startup");
    void recoverAtStartup();
  }
}
