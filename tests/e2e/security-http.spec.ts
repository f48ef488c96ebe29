import { expect, request as playwrightRequest, test } from "@playwright/test";
import { hashPassword } from "@/lib/auth/password";
import { apiAs, baseURL, freshEmail, signInApi } from "./support/auth";
import { query } from "./support/db";
import { discoverRoutes, WRITE_METHODS } from "../fuzz/routes";

/**
 * Cross-site refusal, security headers, cookie flags and sign-out over HTTP against the production build.
 * Source: OWASP Cheat Sheets "Cross-Site Request Forgery Prevention" (verify Origin on state-changing
 * requests) and "HTTP Headers" (CSP with nonces, frame-ancestors, nosniff, Referrer-Policy) — from memory.
 */

const EVIL = "https://lift-parts-offer.example";

test.describe("cross-site requests", () => {
  test("every state-changing route refuses another site's Origin with 403 and writes nothing", async () => {
    const admin = await apiAs("admin@lanternfell.example");
    const [before] = await query<{ n: number }>("SELECT COUNT(*) AS n FROM audit_entries");
    let checked = 0;
    for (const route of discoverRoutes()) {
      if (route.skipProbe) continue; // next-auth's own routes: its CSRF token protects them
      const url = route.pattern.replace(/\[[^\]]+\]/g, "1");
      for (const method of route.methods.filter((m) => WRITE_METHODS.includes(m))) {
        for (const headers of [{ origin: EVIL }, { origin: "null" }, { "sec-fetch-site": "cross-site" }] as Record<string, string>[]) {
          const res = await admin.fetch(url, { method, headers, data: {} });
          const what = `${method} ${url} with ${JSON.stringify(headers)}: ${res.status()}`;
          expect(res.status(), what).toBe(403);
          expect(((await res.json()) as { error: string }).error, what).toMatch(/Cross-site request refused/);
          checked += 1;
        }
      }
    }
    expect(checked).toBeGreaterThan(30);
    const [after] = await query<{ n: number }>("SELECT COUNT(*) AS n FROM audit_entries");
    expect(Number(after.n)).toBe(Number(before.n));
    await admin.dispose();
  });

  test("the app's own origin, and tools that send no Origin, are let through to validation", async () => {
    const admin = await apiAs("admin@lanternfell.example");
    const same = await admin.post("/api/lifts", { data: {}, headers: { origin: baseURL, "sec-fetch-site": "same-origin" } });
    expect(same.status()).toBe(400);
    const none = await admin.post("/api/lifts", { data: {} });
    expect(none.status()).toBe(400);
    await admin.dispose();
  });
});

test.describe("security headers", () => {
  test("pages carry a nonce CSP without inline-script holes, frame-ancestors, nosniff and a referrer policy", async () => {
    const anon = await playwrightRequest.newContext({ baseURL });
    const admin = await apiAs("admin@lanternfell.example");
    const seen = new Set<string>();
    for (const [ctx, path] of [[anon, "/"], [anon, "/sign-in"], [admin, "/dashboard"], [admin, "/lifts"]] as const) {
      const res = await ctx.get(path, { maxRedirects: 0 });
      expect(res.status(), path).toBe(200);
      const h = res.headers();
      const csp = h["content-security-policy"] ?? "";
      const script = csp.split(";").find((d) => d.trim().startsWith("script-src")) ?? "";
      const nonce = /'nonce-([A-Za-z0-9+/=]+)'/.exec(script)?.[1];
      expect(nonce, `${path}: script-src has a nonce (${csp})`).toBeTruthy();
      expect(script, path).not.toContain("'unsafe-inline'");
      expect(csp, path).toContain("frame-ancestors 'none'");
      expect(csp, path).toContain("object-src 'none'");
      expect(h["x-content-type-options"], path).toBe("nosniff");
      expect(h["referrer-policy"], path).toBe("strict-origin-when-cross-origin");
      expect(h["x-frame-options"], path).toBe("DENY");
      expect(h["x-powered-by"], path).toBeUndefined();
      // Every inline script in the HTML carries this request's nonce.
      const html = await res.text();
      for (const tag of html.match(/<script\b[^>]*>/g) ?? []) expect(tag, path).toContain(`nonce="${nonce}"`);
      seen.add(nonce!);
    }
    expect(seen.size, "a fresh nonce per request").toBe(4);
    const api = await admin.get("/api/lifts");
    expect(api.headers()["content-security-policy"]).toContain("default-src 'none'");
    expect(api.headers()["x-content-type-options"]).toBe("nosniff");
    await anon.dispose();
    await admin.dispose();
  });

  test("the pages run under the policy: no CSP violation, the sign-in form hydrates and signs in", async ({ page }) => {
    const violations: string[] = [];
    page.on("console", (m) => {
      if (/Content Security Policy|Refused to (execute|load|apply)/i.test(m.text())) violations.push(m.text());
    });
    await page.goto("/sign-in");
    await page.getByLabel("E-mail").fill("engineer@lanternfell.example");
    await page.getByLabel("Password").fill("tautline-demo");
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL("**/dashboard");
    await page.goto("/lifts");
    await expect(page.getByTestId("page-title")).toBeVisible();
    expect(violations).toEqual([]);
  });
});

test.describe("session cookies and sign-out", () => {
  test("the session cookie is HttpOnly, SameSite=Lax and scoped to the site", async () => {
    const ctx = await playwrightRequest.newContext({ baseURL });
    const res = await signInApi(ctx, "viewer@lanternfell.example");
    const cookies = res.headersArray().filter((h) => h.name.toLowerCase() === "set-cookie").map((h) => h.value);
    const session = cookies.find((c) => /next-auth\.session-token=/.test(c));
    expect(session, cookies.join("\n")).toBeTruthy();
    expect(session).toMatch(/;\s*HttpOnly/i);
    expect(session).toMatch(/;\s*SameSite=Lax/i);
    expect(session).toMatch(/;\s*Path=\//i);
    await ctx.dispose();
  });

  test("after sign-out the old session token no longer works", async () => {
    // A user of its own: signing out ends every session of the account, and other tests use the demo accounts.
    const email = freshEmail("sign-out");
    const password = "take-up-travel-42";
    await query(
      "INSERT INTO users (organisation_id, email, name, role, password_hash, units, active, session_version, created_at, updated_at) SELECT id, ?, 'Sign-out tester', 'viewer', ?, 'si', 1, 1, NOW(), NOW() FROM organisations WHERE slug = 'lanternfell'",
      [email, await hashPassword(password)],
    );
    const ctx = await apiAs(email, password);
    const state = await ctx.storageState();
    const token = state.cookies.find((c) => c.name.endsWith("next-auth.session-token"))!;
    expect((await ctx.get("/api/me")).status()).toBe(200);
    const { csrfToken } = (await (await ctx.get("/api/auth/csrf")).json()) as { csrfToken: string };
    const out = await ctx.post("/api/auth/signout", { form: { csrfToken, json: "true" }, maxRedirects: 0 });
    expect(out.status()).toBeLessThan(400);
    // Someone who kept a copy of the cookie (a shared computer, a stolen token) replays it.
    const replay = await playwrightRequest.newContext({ baseURL, extraHTTPHeaders: { cookie: `${token.name}=${token.value}` } });
    expect((await replay.get("/api/me")).status()).toBe(401);
    await replay.dispose();
    await ctx.dispose();
    // Signing in again works.
    const again = await apiAs(email, password);
    expect((await again.get("/api/me")).status()).toBe(200);
    await again.dispose();
  });
});
