import { z, type ZodType } from "zod";
import { badRequest, fromZod, HttpError } from "./errors";
import { brokenTextIssues } from "./text";

const DEFAULT_MAX_BYTES = 1_000_000;

/**
 * The default body shape: a JSON object. Domain functions validate its fields with the resource's own
 * schema, so direct callers (tests, seeds) get the same rules as the API.
 */
export const jsonObject = z.record(z.string(), z.unknown(), { error: "the body must be a JSON object" });
/** Any JSON body (e.g. a scenario file, which the import validates to report every problem). */
export const anyJson = z.unknown();

const tooLarge = (maxBytes: number) =>
  new HttpError(413, `The body is larger than ${maxBytes} bytes.`, [{ path: "(body)", message: "too large" }], { Connection: "close" });

/**
 * The raw body, at most `maxBytes`. A declared Content-Length over the limit is refused before anything is
 * read; a body without one (chunked) is read chunk by chunk and the stream is cancelled at the first byte
 * past the limit, so an endless or huge body never sits in memory whole.
 */
export async function readBodyBytes(req: Request, maxBytes = DEFAULT_MAX_BYTES): Promise<Uint8Array<ArrayBuffer>> {
  const declared = req.headers.get("content-length");
  if (declared !== null && /^\d+$/.test(declared.trim()) && Number(declared) > maxBytes) throw tooLarge(maxBytes);
  if (!req.body) return new Uint8Array(0);
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > maxBytes) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge(maxBytes);
    }
    chunks.push(value);
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}

/** The body as UTF-8 text, at most `maxBytes` (see readBodyBytes). */
export async function readBodyText(req: Request, maxBytes = DEFAULT_MAX_BYTES): Promise<string> {
  return new TextDecoder().decode(await readBodyBytes(req, maxBytes));
}

/** The multipart form of a request, read within `maxBytes` (Request.formData() alone reads any size). */
export async function readFormData(req: Request, maxBytes: number): Promise<FormData> {
  const bytes = await readBodyBytes(req, maxBytes);
  return new Response(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength), { headers: { "content-type": req.headers.get("content-type") ?? "" } }).formData();
}

/**
 * Reads a JSON body and validates it with a zod schema. Wrong content type, oversized or broken JSON,
 * text that is not valid Unicode (a lone UTF-16 surrogate) and invalid fields all become a 400 (413 for
 * size) naming what is wrong; nothing reaches the database.
 */
export function parseJsonBody(req: Request): Promise<Record<string, unknown>>;
export function parseJsonBody<T>(req: Request, schema: ZodType<T>, maxBytes?: number): Promise<T>;
export async function parseJsonBody(req: Request, schema: ZodType = jsonObject, maxBytes = DEFAULT_MAX_BYTES): Promise<unknown> {
  const type = req.headers.get("content-type") ?? "";
  if (!type.toLowerCase().startsWith("application/json")) {
    throw badRequest("Send the body as JSON (Content-Type: application/json).", [
      { path: "(content-type)", message: `expected application/json, got ${type || "nothing"}` },
    ]);
  }
  const text = await readBodyText(req, maxBytes);
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    throw badRequest("The body is not valid JSON.", [{ path: "(body)", message: "invalid JSON" }]);
  }
  const broken = brokenTextIssues(data);
  if (broken.length) throw badRequest("The request has text that cannot be stored (invalid Unicode or control characters).", broken);
  const result = schema.safeParse(data);
  if (!result.success) throw fromZod(result.error);
  return result.data;
}

/**
 * The query string as a plain object of strings; with a schema, validated by it. Without one the domain
 * function validates it with its own list-query schema, so direct callers get the same rules.
 */
export function parseQuery(req: Request): Record<string, string>;
export function parseQuery<T>(req: Request, schema: ZodType<T>): T;
export function parseQuery(req: Request, schema: ZodType = z.record(z.string(), z.string())): unknown {
  const params = Object.fromEntries(new URL(req.url).searchParams.entries());
  const broken = brokenTextIssues(params);
  if (broken.length) throw badRequest("The query string has text that cannot be stored (invalid Unicode or control characters).", broken);
  const result = schema.safeParse(params);
  if (!result.success) throw fromZod(result.error, "The query string has invalid fields.");
  return result.data;
}
