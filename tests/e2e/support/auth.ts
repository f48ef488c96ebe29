import { expect, request as playwrightRequest, type APIRequestContext, type Page } from "@playwright/test";
import { DEMO_PASSWORD } from "@/lib/auth/demo-accounts";

export const baseURL = `http://127.0.0.1:${Number(process.env.TEST_APP_PORT ?? 3100)}`;

/**
 * Signs in through next-auth's credentials endpoint the way a browser form does: fetch the CSRF token
 * (which also sets its cookie), then post the form. The session cookie stays in `ctx`.
 */
export async function signInApi(ctx: APIRequestContext, email: string, password = DEMO_PASSWORD) {
  const csrf = await ctx.get("/api/auth/csrf");
  expect(csrf.ok()).toBe(true);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  return ctx.post("/api/auth/callback/credentials", {
    form: { csrfToken, email, password, json: "true" },
    maxRedirects: 0,
  });
}

/** A fresh API client signed in as `email` (throws if the sign-in fails). */
export async function apiAs(email: string, password = DEMO_PASSWORD): Promise<APIRequestContext> {
  const ctx = await playwrightRequest.newContext({ baseURL });
  const res = await signInApi(ctx, email, password);
  const body = (await res.json()) as { url?: string };
  if (!res.ok() || body.url?.includes("error=")) throw new Error(`Sign-in as ${email} failed (${res.status()} ${body.url})`);
  return ctx;
}

/** Signs in through the real form and waits for the dashboard. */
export async function signInUi(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL("**/dashboard");
  await expect(page.getByTestId("page-title")).toContainText("Good to see you");
}

let counter = 0;
/** An address nobody has used yet, so tests can run twice on the same database. */
export function freshEmail(tag: string): string {
  counter += 1;
  return `${tag}-${Date.now().toString(36)}-${process.pid}-${counter}@lanternfell.example`;
}
