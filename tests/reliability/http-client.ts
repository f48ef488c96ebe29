import { DEMO_PASSWORD } from "../../lib/auth/demo-accounts";

/** A tiny cookie-keeping HTTP client for scripts that talk to a running Tautline (no browser). */
export class Client {
  readonly cookies = new Map<string, string>();
  /** Every Set-Cookie header received, as sent (for checking the flags). */
  readonly setCookies: string[] = [];
  constructor(readonly base: string) {}

  async fetch(pathname: string, init: RequestInit & { timeoutMs?: number } = {}): Promise<Response> {
    const headers = new Headers(init.headers);
    if (this.cookies.size) headers.set("cookie", [...this.cookies].map(([k, v]) => `${k}=${v}`).join("; "));
    const res = await fetch(this.base + pathname, { ...init, headers, redirect: "manual", signal: AbortSignal.timeout(init.timeoutMs ?? 15_000) });
    for (const c of res.headers.getSetCookie()) {
      this.setCookies.push(c);
      const [pair] = c.split(";");
      const i = pair.indexOf("=");
      this.cookies.set(pair.slice(0, i).trim(), pair.slice(i + 1));
    }
    return res;
  }

  json(pathname: string, method: string, body: unknown): Promise<Response> {
    return this.fetch(pathname, { method, headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
  }

  /** next-auth credentials sign-in: CSRF token (and its cookie), then the form post. */
  async signIn(email: string, password = DEMO_PASSWORD): Promise<void> {
    const csrf = (await (await this.fetch("/api/auth/csrf")).json()) as { csrfToken: string };
    const res = await this.fetch("/api/auth/callback/credentials", {
      method: "POST",
      headers: { "content-type": "application/x-www-form-urlencoded" },
      body: new URLSearchParams({ csrfToken: csrf.csrfToken, email, password, json: "true" }).toString(),
    });
    const body = (await res.json().catch(() => ({}))) as { url?: string };
    if (!res.ok || body.url?.includes("error=")) throw new Error(`sign-in as ${email} failed (${res.status} ${body.url ?? ""})`);
  }
}

export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
