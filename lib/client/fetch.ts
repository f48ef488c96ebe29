/**
 * Client-side fetch helpers for our API routes: JSON in, JSON out, errors in the shape
 * lib/http/errors.ts answers ({ error, issues: [{ path, message }] }).
 */
export interface FieldIssue {
  path: string;
  message: string;
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly issues: FieldIssue[] = [],
    readonly headers?: Headers,
  ) {
    super(message);
    this.name = "ApiError";
  }
}

async function readError(res: Response): Promise<ApiError> {
  const body = (await res.json().catch(() => null)) as { error?: string; issues?: FieldIssue[] } | null;
  return new ApiError(res.status, body?.error ?? `The server answered ${res.status}.`, body?.issues ?? [], res.headers);
}

/** GET a JSON resource; throws ApiError on any non-2xx answer (SWR's fetcher). */
export async function getJson<T>(url: string): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, { headers: { accept: "application/json" } });
  } catch {
    throw new ApiError(0, "The server could not be reached. Check your connection.");
  }
  if (!res.ok) throw await readError(res);
  return (await res.json()) as T;
}

/**
 * Sends JSON with any method; throws ApiError with the field issues on 4xx/5xx. `idempotencyKey` (e.g. one
 * crypto.randomUUID() per form submission, reused on retry) lets a write that was committed be answered
 * from its row instead of being written twice.
 */
export async function sendJson<T>(
  url: string,
  method: "POST" | "PATCH" | "PUT" | "DELETE",
  body?: unknown,
  options: { idempotencyKey?: string } = {},
): Promise<T> {
  let res: Response;
  const headers: Record<string, string> = body === undefined ? { accept: "application/json" } : { "content-type": "application/json", accept: "application/json" };
  if (options.idempotencyKey) headers["idempotency-key"] = options.idempotencyKey;
  try {
    res = await fetch(url, {
      method,
      headers,
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    throw new ApiError(0, "The server could not be reached. Check your connection.");
  }
  if (!res.ok) throw await readError(res);
  if (res.status === 204) return undefined as T;
  return (await res.json().catch(() => undefined)) as T;
}

/** The outcome of a form's request as data (for forms that show the error beside their fields). */
export interface ApiAnswer<T> {
  ok: boolean;
  /** The HTTP status of a refusal (0: the server could not be reached); 0 on success. */
  status: number;
  data: T | null;
  error: string | null;
  errors: Record<string, string>;
}

/** sendJson, with a refusal returned as `{ ok: false, error, errors }` instead of thrown. */
export async function submitJson<T = unknown>(url: string, method: "POST" | "PATCH" | "PUT" | "DELETE", body?: unknown): Promise<ApiAnswer<T>> {
  try {
    return { ok: true, status: 0, data: await sendJson<T>(url, method, body), error: null, errors: {} };
  } catch (err) {
    if (!(err instanceof ApiError)) throw err;
    return { ok: false, status: err.status, data: null, error: err.message, errors: issueMap(err.issues) };
  }
}

/** A fresh Idempotency-Key (randomUUID needs a secure context; plain-http hosts get a random fallback). */
export function newIdempotencyKey(): string {
  return globalThis.crypto?.randomUUID?.() ?? `${Date.now().toString(36)}-${Math.random().toString(36).slice(2)}-${Math.random().toString(36).slice(2)}`;
}

/** Field path → first message. */
export function issueMap(issues: readonly FieldIssue[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const i of issues) if (!(i.path in out)) out[i.path] = i.message;
  return out;
}

/** A query string from defined, non-empty values. */
export function queryString(params: Record<string, string | number | boolean | undefined | null>): string {
  const q = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) if (v !== undefined && v !== null && v !== "") q.set(k, String(v));
  const s = q.toString();
  return s ? `?${s}` : "";
}
