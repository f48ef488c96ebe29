// Optimistic concurrency: edits send the version they loaded; a stale one answers 409 with the current version.
import { HttpError } from "@/lib/http/errors";

export { versionField } from "./version";

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
