import type { ZodType } from "zod";
import { badRequest, fromZod, HttpError } from "./errors";

const DEFAULT_MAX_BYTES = 1_000_000;

/**
 * Reads a JSON body and validates it with a zod schema. Wrong content type, oversized or broken JSON
 * and invalid fields all become a 400 (413 for size) naming what is wrong; nothing reaches the database.
 */
export async function parseJsonBody<T>(req: Request, schema: ZodType<T>, maxBytes = DEFAULT_MAX_BYTES): Promise<T> {
  const type = req.headers.get("content-type") ?? "";
  if (!type.toLowerCase().startsWith("application/json")) {
    throw badRequest("Send the body as JSON (Content-Type: application/json).", [
      { path: "(content-type)", message: `expected application/json, got ${type || "nothing"}` },
    ]);
  }
  const text = await req.text();
  if (Buffer.byteLength(text, "utf8") > maxBytes) {
    throw new HttpError(413, `The body is larger than ${maxBytes} bytes.`, [{ path: "(body)", message: "too large" }]);
  }
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    throw badRequest("The body is not valid JSON.", [{ path: "(body)", message: "invalid JSON" }]);
  }
  const result = schema.safeParse(data);
  if (!result.success) throw fromZod(result.error);
  return result.data;
}

/** Validates the query string (as a plain object of strings) with a zod schema. */
export function parseQuery<T>(req: Request, schema: ZodType<T>): T {
  const params = Object.fromEntries(new URL(req.url).searchParams.entries());
  const result = schema.safeParse(params);
  if (!result.success) throw fromZod(result.error, "The query string has invalid fields.");
  return result.data;
}
