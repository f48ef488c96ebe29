/** Runs once when the server starts: a production server without NEXTAUTH_SECRET refuses to start. */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME === "nodejs") {
    const { assertAuthConfigured } = await import("./lib/auth/startup");
    assertAuthConfigured();
  }
}
