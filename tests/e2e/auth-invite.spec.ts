import { expect, test } from "@playwright/test";
import { apiAs, freshEmail, signInUi } from "./support/auth";
import { linkIn, waitForMail } from "./support/mail";

test("an admin invites a colleague, who follows the e-mailed link, sets a password and signs in", async ({ page, browser }) => {
  test.setTimeout(120_000);
  const email = freshEmail("invitee");
  await signInUi(page, "admin@lanternfell.example");
  await page.goto("/admin/users");
  const form = page.getByTestId("invite-form");
  await form.getByLabel("E-mail").fill(email);
  await form.getByLabel("Name").fill("Ilse Marrow");
  await form.getByLabel("Role").selectOption("operator");
  await form.getByRole("button", { name: "Send invitation" }).click();
  await expect(page.getByTestId("invite-sent")).toContainText(`Invitation sent to ${email}`);
  await expect(page.getByTestId(`user-row-${email}`)).toContainText("invited");

  // The admin can read the message in the development mailbox, with the link clickable.
  await page.goto("/admin/mail");
  await expect(page.getByTestId("mail-list")).toContainText(email);

  const mail = await waitForMail(email, "you are invited to Lanternfell Park");
  const link = linkIn(mail);
  expect(link).toMatch(/\/accept-invite\?token=[A-Za-z0-9_-]{43}$/);

  // The invitee, in a browser of their own.
  const invitee = await browser.newContext();
  const p = await invitee.newPage();
  await p.goto(link);
  await expect(p.getByTestId("page-title")).toHaveText("Join Tautline");
  await expect(p.getByText("as Operations & maintenance")).toBeVisible();

  // Bad input gets a clear message on the field and uses nothing up.
  await p.getByLabel("Choose a password").fill("short");
  await p.getByLabel("Password again").fill("short");
  await p.getByRole("button", { name: "Create my account" }).click();
  await expect(p.getByTestId("error-password")).toHaveText("Use at least 10 characters.");
  await p.getByLabel("Choose a password").fill("counterweight-9");
  await p.getByLabel("Password again").fill("counterweight-8");
  await p.getByRole("button", { name: "Create my account" }).click();
  await expect(p.getByTestId("error-confirm")).toHaveText("The two passwords differ.");

  await p.getByLabel("Password again").fill("counterweight-9");
  await p.getByRole("button", { name: "Create my account" }).click();
  await p.waitForURL(/\/sign-in\?accepted=1/);
  await expect(p.getByTestId("sign-in-notice")).toContainText("Your account is ready");
  await expect(p.getByLabel("E-mail")).toHaveValue(email);
  await p.getByLabel("Password").fill("counterweight-9");
  await p.getByRole("button", { name: "Sign in" }).click();
  await p.waitForURL("**/dashboard");
  await expect(p.getByTestId("user-role")).toHaveText("Operations & maintenance");

  // The link works once.
  const other = await browser.newContext();
  const q = await other.newPage();
  await q.goto(link);
  await expect(q.getByTestId("link-problem")).toContainText("already used");
  await other.close();

  // Deactivated: the very next request of the invitee's open session no longer gets in.
  await page.goto("/admin/users");
  await page.getByTestId(`deactivate-${email}`).click();
  // Nothing happens until the admin confirms.
  await expect(page.getByTestId("confirm-bar")).toContainText(`Deactivate`);
  await expect(page.getByTestId("confirm-bar")).toContainText(email);
  await expect(page.getByTestId("users-message")).toHaveCount(0);
  await page.getByTestId("confirm-action").click();
  await expect(page.getByTestId("users-message")).toContainText("deactivated");
  await p.goto("/dashboard");
  await expect(p).toHaveURL(/\/sign-in/);
  const me = await p.request.get("/api/me");
  expect(me.status()).toBe(401);

  // Reactivated, they sign in again with their password.
  await page.getByTestId(`reactivate-${email}`).click();
  await expect(page.getByTestId("users-message")).toContainText("can sign in again");
  await signInUi(p, email, "counterweight-9");
  await invitee.close();
});

test("an admin changes a role, and the change applies at the person's next request", async ({ page }) => {
  const admin = await apiAs("admin@lanternfell.example");
  const email = freshEmail("rolechange");
  const invited = await admin.post("/api/admin/users", { data: { email, name: "Per Lindqvist-Moor", role: "viewer" } });
  expect(invited.status()).toBe(201);
  const link = linkIn(await waitForMail(email, "invited"));
  const token = new URL(link).searchParams.get("token");
  const accepted = await admin.post("/api/account/accept-invite", { data: { token, name: "Per Lindqvist-Moor", password: "pick-up-point-3" } });
  expect(accepted.status()).toBe(200);

  await signInUi(page, email, "pick-up-point-3");
  await expect(page.getByTestId("user-role")).toHaveText("Viewer");
  // The invitation's answer names no id (it must not tell an existing account from a new one): find it in the list.
  const { users } = (await (await admin.get("/api/admin/users")).json()) as { users: { id: number; email: string }[] };
  const user = users.find((u) => u.email === email)!;
  const changed = await admin.patch(`/api/admin/users/${user.id}`, { data: { role: "engineer" } });
  expect(changed.status()).toBe(200);
  await page.reload();
  await expect(page.getByTestId("user-role")).toHaveText("Ride engineer");
  await admin.dispose();
});

test("an admin can neither demote nor deactivate themselves", async () => {
  const admin = await apiAs("admin@lanternfell.example");
  const me = (await (await admin.get("/api/me")).json()) as { id: number };
  const demote = await admin.patch(`/api/admin/users/${me.id}`, { data: { role: "viewer" } });
  expect(demote.status()).toBe(400);
  expect((await demote.json()).issues).toEqual([{ path: "role", message: "Ask another administrator to change your role." }]);
  const off = await admin.patch(`/api/admin/users/${me.id}`, { data: { active: false } });
  expect(off.status()).toBe(400);
  expect(((await (await admin.get("/api/me")).json()) as { role: string }).role).toBe("admin");
  await admin.dispose();
});
