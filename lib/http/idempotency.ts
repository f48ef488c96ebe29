import { badRequest } from "./errors";

/**
 * The client's `Idempotency-Key` header (1–100 letters, digits and `-_.:`), or undefined when none was
 * sent. A write that takes one stores it with the row it commits; the same key again is answered from
 * that row, so retrying after a lost answer never writes twice.
 */
export function idempotencyKeyOf(req: Request): string | undefined {
  const raw = req.headers.get("idempotency-key");
  if (raw === null) return undefined;
  const key = raw.trim();
  if (!/^[A-Za-z0-9_.:-]{1,100}$/.test(key)) {
    throw badRequest("The Idempotency-Key header is not usable.", [
      { path: "(Idempotency-Key)", message: "use 1 to 100 letters, digits, dashes, underscores, dots or colons (e.g. a UUID)" },
    ]);
  }
  return key;
}
