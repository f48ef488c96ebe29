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

export interface ApiAnswer<T> {
  ok: boolean;
  status: number;
  data: T | null;
  error: string | null;
  errors: FieldErrors;
}

/** Sends JSON and reads the answer in the shape lib/http/errors.ts produces. */
export async function sendJson<T = unknown>(url: string, method: string, body?: unknown): Promise<ApiAnswer<T>> {
  let res: Response;
  try {
    res = await fetch(url, {
      method,
      headers: body === undefined ? {} : { "content-type": "application/json" },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    return { ok: false, status: 0, data: null, error: "The server could not be reached. Check your connection.", errors: {} };
  }
  const json = (await res.json().catch(() => null)) as (T & { error?: string; issues?: { path: string; message: string }[] }) | null;
  if (res.ok) return { ok: true, status: res.status, data: json, error: null, errors: {} };
  return {
    ok: false,
    status: res.status,
    data: null,
    error: json?.error ?? `The server answered ${res.status}.`,
    errors: issuesToErrors(json?.issues),
  };
}
