import { authSecret } from "@/lib/auth/secret";

/** Runs once when the server starts: a production server without NEXTAUTH_SECRET refuses to start. */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  try {
    authSecret();
  } catch (err) {
    console.error(`\n${(err as Error).message}\n`);
    process.exit(1);
  }
}
