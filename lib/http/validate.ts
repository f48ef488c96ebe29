import type { ZodType } from "zod";
import { badRequest, fromZod, type FieldIssue } from "@/lib/http/errors";

/** Validates already-parsed input (domain functions called directly, e.g. from tests) with the same schema. */
export function validate<T>(schema: ZodType<T>, data: unknown): T {
  const r = schema.safeParse(data);
  if (!r.success) throw fromZod(r.error);
  return r.data;
}

/** Throws one 400 listing every collected problem, or returns when there are none. */
export function throwIfIssues(issues: FieldIssue[], message = "The request has invalid fields."): void {
  if (issues.length) throw badRequest(message, issues);
}
