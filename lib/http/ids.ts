import { notFound } from "@/lib/http/errors";

/** A path segment that must be a positive whole-number id; anything else is simply not found. */
export function parseId(segment: string | undefined, what = "Not found."): number {
  if (!segment || !/^[1-9][0-9]{0,9}$/.test(segment)) throw notFound(what);
  const n = Number(segment);
  if (n > 4_294_967_295) throw notFound(what);
  return n;
}
