import { authSecret } from "./secret";

/** Stops a production server that has no NEXTAUTH_SECRET, with the reason, before it serves anything. */
export function assertAuthConfigured(): void {
  try {
    authSecret();
  } catch (err) {
    console.error(`\n${(err as Error).message}\n`);
    process.exit(1);
  }
}
