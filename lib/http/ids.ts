import { notFound } from "@/lib/http/errors";

/**
 * The one id parser for path segments and query values: a positive whole number written in plain decimal
 * digits without a leading zero, at most an unsigned 32-bit integer. `0x10`, `1e3`, `010`, `+5`, `1.0`
 * and ` 7` are not ids (Number() would accept them all).
 */
export function toId(segment: unknown): number | null {
  if (typeof segment !== "string" || !/^[1-9][0-9]{0,9}$/.test(segment)) return null;
  const n = Number(segment);
  return n <= 4_294_967_295 ? n : null;
}

/** A path segment that must be an id (see toId); anything else is simply not found (404). */
export function parseId(segment: string | undefined, what = "Not found."): number {
  const id = toId(segment);
  if (id === null) throw notFound(what);
  return id;
}
