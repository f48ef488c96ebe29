import { z } from "zod";
import { HttpError } from "@/lib/http/errors";

/** Every update carries the version it edits. */
export const versionField = z
  .number({ error: "version is required: send the version you are editing" })
  .int({ error: "version must be a whole number" })
  .min(1, { error: "version must be at least 1" });

/**
 * A stale update answers 409 and writes nothing. The answer names the current version (issue on path
 * `version`, header `X-Current-Version`) so a client can reload and re-apply its change.
 */
export function assertVersion(current: number, sent: number, what: string): void {
  if (current === sent) return;
  throw new HttpError(
    409,
    `This ${what} was changed by someone else (now version ${current}, you edited version ${sent}). Reload it and apply your change again.`,
    [{ path: "version", message: `stale: the current version is ${current}` }],
    { "X-Current-Version": String(current) },
  );
}
