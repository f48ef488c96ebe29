import type { ZodType } from "zod";

/** Field path → first message, from a zod result or from an API answer `{ issues: [{ path, message }] }`. */
export type FieldErrors = Record<string, string>;

export function issuesToErrors(issues: ReadonlyArray<{ path: string; message: string }> | undefined): FieldErrors {
  const out: FieldErrors = {};
  for (const i of issues ?? []) if (!(i.path in out)) out[i.path] = i.message;
  return out;
}

/** Validates in the browser with the same schema the API uses; returns errors keyed like the API's. */
export function validate<T>(schema: ZodType<T>, value: unknown): { data: T; errors: null } | { data: null; errors: FieldErrors } {
  const r = schema.safeParse(value);
  if (r.success) return { data: r.data, errors: null };
  return {
    data: null,
    errors: issuesToErrors(r.error.issues.map((i) => ({ path: i.path.length ? i.path.map(String).join(".") : "(body)", message: i.message }))),
  };
}
