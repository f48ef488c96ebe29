import { z } from "zod";
import { parseJsonBody } from "@/lib/http/request";

const jsonObject = z.record(z.string(), z.unknown(), { error: "the body must be a JSON object" });

/**
 * A JSON object body (content type, size and syntax checked). The domain function validates its fields
 * with the resource's own schema, so direct callers (tests, seeds) get the same rules as the API.
 */
export function readObjectBody(req: Request, maxBytes?: number): Promise<Record<string, unknown>> {
  return parseJsonBody(req, jsonObject, maxBytes);
}

/** Any JSON body (e.g. a scenario file, which the import validates to report every problem). */
export function readJsonBody(req: Request, maxBytes?: number): Promise<unknown> {
  return parseJsonBody(req, z.unknown(), maxBytes);
}

/** The query string as a plain object of strings, for the domain function's list-query schema. */
export function queryOf(req: Request): Record<string, string> {
  return Object.fromEntries(new URL(req.url).searchParams.entries());
}
