import { expect, test } from "@playwright/test";
import { apiAs, freshEmail, signInApi } from "./support/auth";
import { linkIn, waitForMail } from "./support/mail";

test("the sign-in form names empty and malformed fields, and a wrong password gets one plain message", async ({ page }) => {
  await page.goto("/sign-in");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("error-email")).toHaveText("Enter an e-mail address.");
  await expect(page.getByTestId("error-password")).toHaveText("Enter your password.");
  await page.getByLabel("E-mail").fill("engineer.lanternfell");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("error-email")).toContainText("valid e-mail address");

  await page.getByLabel("E-mail").fill("reviewer@lanternfell.example");
  await page.getByLabel("Password").fill("not-the-password");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("sign-in-error")).toHaveText("The e-mail or password is not right, or the account is not active.");
  await expect(page).toHaveURL(/\/sign-in/);
});

test("repeated failed sign-ins are slowed down: a clear message on the page and 429 on the API", async ({ page, request }) => {
  // A throwaway account, so the demo accounts stay usable for the other tests.
  const admin = await apiAs("admin@lanternfell.example");
  const email = freshEmail("guessed");
  expect((await admin.post("/api/admin/users", { data: { email, name: "Guess Target", role: "viewer" } })).status()).toBe(201);
  await admin.dispose();

  for (let i = 0; i < 5; i++) {
    const r = await signInApi(request, email, `wrong-guess-${i}`);
    expect(r.status()).toBe(401);
  }
  const blocked = await signInApi(request, email, "wrong-guess-6");
  expect(blocked.status()).toBe(429);
  expect(Number(blocked.headers()["retry-after"])).toBeGreaterThan(60);
  expect((await blocked.json()).error).toContain("Too many failed sign-ins");

  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill("any-password-at-all");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("sign-in-error")).toContainText("Too many failed sign-ins");
});

test("bad input to invite, reset, accept and profile answers 400 with field paths and stores nothing", async () => {
  const admin = await apiAs("admin@lanternfell.example");
  const count = async () => ((await (await admin.get("/api/admin/users")).json()) as { users: unknown[] }).users.length;
  const before = await count();

  const invite = await admin.post("/api/admin/users", { data: { email: "not-an-address", name: "", role: "captain" } });
  expect(invite.status()).toBe(400);
  expect(((await invite.json()).issues as { path: string }[]).map((i) => i.path)).toEqual(["email", "name", "role"]);
  const notJson = await admin.post("/api/admin/users", { headers: { "content-type": "text/plain" }, data: "email=x" });
  expect(notJson.status()).toBe(400);
  expect(await count()).toBe(before);

  const reset = await admin.post("/api/account/reset-password", { data: { token: "short", password: "tiny" } });
  expect(reset.status()).toBe(400);
  expect(((await reset.json()).issues as { path: string }[]).map((i) => i.path)).toEqual(["token", "password"]);

  const accept = await admin.post("/api/account/accept-invite", { data: { token: "A".repeat(43), name: "X", password: "long-enough-pass" } });
  expect(accept.status()).toBe(400);
  expect((await accept.json()).issues[0].path).toBe("token");

  const units = await admin.patch("/api/me", { data: { units: "furlongs" } });
  expect(units.status()).toBe(400);
  expect((await units.json()).issues[0].path).toBe("units");
  expect(((await (await admin.get("/api/me")).json()) as { units: string }).units).toBe("si");

  const pw = await admin.post("/api/me/password", { data: { currentPassword: "", newPassword: "abc" } });
  expect(pw.status()).toBe(400);
  expect(((await pw.json()).issues as { path: string }[]).map((i) => i.path).sort()).toEqual(["currentPassword", "newPassword"]);
  await admin.dispose();
});

test("the invite form shows field errors inline and a taken address from the server", async ({ page }) => {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill("admin@lanternfell.example");
  await page.getByLabel("Password").fill("tautline-demo");
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL("**/dashboard");
  await page.goto("/admin/users");
  const form = page.getByTestId("invite-form");
  await form.getByRole("button", { name: "Send invitation" }).click();
  await expect(form.getByTestId("error-email")).toHaveText("Enter an e-mail address.");
  await expect(form.getByTestId("error-name")).toHaveText("Enter a name.");
  await form.getByLabel("E-mail").fill("viewer@lanternfell.example");
  await form.getByLabel("Name").fill("Someone");
  await form.getByRole("button", { name: "Send invitation" }).click();
  await expect(form.getByTestId("error-email")).toHaveText("This person is already a user of your organisation.");
});

test("settings: units persist, a wrong current password is named, a new password signs in", async ({ page }) => {
  test.setTimeout(90_000);
  const admin = await apiAs("admin@lanternfell.example");
  const email = freshEmail("settings");
  expect((await admin.post("/api/admin/users", { data: { email, name: "Oskar Fenwright", role: "reviewer" } })).status()).toBe(201);
  const token = new URL(linkIn(await waitForMail(email, "invited"))).searchParams.get("token");
  expect((await admin.post("/api/account/accept-invite", { data: { token, name: "Oskar Fenwright", password: "initial-pass-1" } })).status()).toBe(200);
  await admin.dispose();

  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill("initial-pass-1");
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL("**/dashboard");

  await page.getByTestId("user-menu").click();
  await page.getByTestId("units-toggle").getByRole("button", { name: /US/ }).click();
  await expect(page.getByTestId("units-toggle").getByRole("button", { name: /US/ })).toHaveAttribute("aria-pressed", "true");
  await page.goto("/settings");
  await expect(page.getByRole("radio", { name: /US customary/ })).toBeChecked();

  const form = page.getByTestId("password-form");
  await form.getByLabel("Current password").fill("wrong-current-1");
  await form.getByLabel("New password", { exact: true }).fill("changed-pass-22");
  await form.getByLabel("New password again").fill("changed-pass-22");
  await form.getByRole("button", { name: "Change password" }).click();
  await expect(form.getByTestId("error-currentPassword")).toHaveText("The current password is not right.");

  await form.getByLabel("Current password").fill("initial-pass-1");
  await form.getByRole("button", { name: "Change password" }).click();
  await page.waitForURL(/\/sign-in\?passwordChanged=1/);
  await expect(page.getByTestId("sign-in-notice")).toContainText("Your password was changed");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill("changed-pass-22");
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL("**/dashboard");
  await expect(page.getByText("US customary", { exact: true }).first()).toBeVisible();
});
