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

/** Sends JSON with any method; throws ApiError with the field issues on 4xx/5xx. */
export async function sendJson<T>(url: string, method: "POST" | "PATCH" | "PUT" | "DELETE", body?: unknown): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, {
      method,
      headers: body === undefined ? { accept: "application/json" } : { "content-type": "application/json", accept: "application/json" },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    throw new ApiError(0, "The server could not be reached. Check your connection.");
  }
  if (!res.ok) throw await readError(res);
  if (res.status === 204) return undefined as T;
  return (await res.json().catch(() => undefined)) as T;
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
