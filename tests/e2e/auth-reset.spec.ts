import { expect, test } from "@playwright/test";
import { apiAs, freshEmail, signInApi, signInUi } from "./support/auth";
import { linkIn, mailsTo, waitForMail } from "./support/mail";

/** A user of the park with a known password, created through the real invitation API. */
async function makeUser(password: string): Promise<string> {
  const admin = await apiAs("admin@lanternfell.example");
  const email = freshEmail("reset");
  expect((await admin.post("/api/admin/users", { data: { email, name: "Rhea Tolland", role: "trainer" } })).status()).toBe(201);
  const token = new URL(linkIn(await waitForMail(email, "invited"))).searchParams.get("token");
  expect((await admin.post("/api/account/accept-invite", { data: { token, name: "Rhea Tolland", password } })).status()).toBe(200);
  await admin.dispose();
  return email;
}

test("a forgotten password is reset through a one-time e-mailed link", async ({ page, browser }) => {
  const email = await makeUser("first-password-1");
  await page.goto("/sign-in");
  await page.getByRole("link", { name: "Forgot your password?" }).click();
  await page.waitForURL("**/forgot-password");
  await expect(page.getByTestId("page-title")).toHaveText("Reset your password");
  await page.getByLabel("E-mail").fill(email);
  await page.getByRole("button", { name: "Send reset link" }).click();
  await expect(page.getByTestId("forgot-sent")).toContainText("If an active account uses this address");

  const link = linkIn(await waitForMail(email, "reset your password"));
  expect(link).toMatch(/\/reset-password\?token=/);
  await page.goto(link);
  await expect(page.getByTestId("page-title")).toHaveText("Choose a new password");
  await page.getByLabel("New password").fill("second-password-2");
  await page.getByLabel("Password again").fill("second-password-2");
  await page.getByRole("button", { name: "Set new password" }).click();
  await page.waitForURL(/\/sign-in\?reset=1/);
  await expect(page.getByTestId("sign-in-notice")).toContainText("Your password was reset");

  // The old password is gone, the new one works, and the link is spent.
  const ctx = await browser.newContext();
  const old = await signInApi(ctx.request, email, "first-password-1");
  expect(((await old.json()) as { url: string }).url).toContain("error=CredentialsSignin");
  await signInUi(page, email, "second-password-2");
  const again = await ctx.newPage();
  await again.goto(link);
  await expect(again.getByTestId("link-problem")).toContainText("already used");
  await ctx.close();
});

test("forgot-password answers the same for an unknown address and sends nothing", async ({ request }) => {
  const unknown = freshEmail("nobody");
  const someone = await makeUser("first-password-1");
  const res = await request.post("/api/account/forgot-password", { data: { email: unknown } });
  expect(res.status()).toBe(202);
  const known = await request.post("/api/account/forgot-password", { data: { email: someone } });
  expect(await res.json()).toEqual(await known.json());
  // Both e-mails go out after the answer. Once the known address's mail (asked for second, with more work
  // to do) has arrived, the unknown one's turn is over: it sent nothing.
  await waitForMail(someone, "reset your password");
  expect(await mailsTo(unknown)).toEqual([]);
});

test("a reset link that is malformed or unknown says so", async ({ page }) => {
  await page.goto("/reset-password?token=abc");
  await expect(page.getByTestId("link-problem")).toContainText("not valid");
  await page.goto(`/reset-password?token=${"A".repeat(43)}`);
  await expect(page.getByTestId("link-problem")).toBeVisible();
  await page.goto("/accept-invite");
  await expect(page.getByTestId("link-problem")).toContainText("needs the link");
});
