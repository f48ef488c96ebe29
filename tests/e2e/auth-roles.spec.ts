import { expect, test } from "@playwright/test";
import { NAV_ITEMS } from "@/components/shell/nav";
import { DEMO_ACCOUNTS, DEMO_ORGANISATIONS } from "@/lib/auth/demo-accounts";
import { can } from "@/lib/auth/permissions";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { SAFETY_CAUTION } from "@/components/ui/SafetyNote";
import { signInUi } from "./support/auth";

test("the landing page says what Tautline is for, offers sign-in and carries the safety caution", async ({ page }) => {
  await page.goto("/");
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  for (const who of ["Ride engineers", "Operations & maintenance", "Trainers"]) {
    await expect(page.getByRole("heading", { name: who })).toBeVisible();
  }
  await expect(page.getByTestId("safety-caution")).toHaveText(SAFETY_CAUTION);
  await page.getByTestId("landing-sign-in").click();
  await expect(page).toHaveURL(/\/sign-in$/);
});

test("a workspace page without a session sends the visitor to sign-in and back after", async ({ page }) => {
  await page.goto("/settings");
  await expect(page).toHaveURL(/\/sign-in\?callbackUrl=%2Fsettings/);
  await page.getByLabel("E-mail").fill("viewer@lanternfell.example");
  await page.getByLabel("Password").fill("tautline-demo");
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL("**/settings");
  await expect(page.getByTestId("page-title")).toHaveText("Settings");
});

const park = DEMO_ACCOUNTS.filter((a) => a.organisation === DEMO_ORGANISATIONS.park.slug);

for (const account of park) {
  test(`${account.role} signs in and sees what the role may see`, async ({ page }) => {
    await signInUi(page, account.email);
    await expect(page.getByTestId("user-role")).toHaveText(ROLE_LABELS[account.role]);
    await expect(page.getByTestId("organisation-name")).toHaveText(DEMO_ORGANISATIONS.park.name);
    // The footer carries the caution on every page; results views may repeat it beside their figures.
    const footerCaution = page.getByRole("contentinfo").getByTestId("safety-caution");
    await expect(footerCaution).toHaveText(SAFETY_CAUTION);

    const nav = page.getByTestId("main-nav").first();
    const expected = NAV_ITEMS.filter((i) => !i.action || can(account.role, i.action)).map((i) => i.label);
    await expect(nav.getByRole("link")).toHaveText(expected);
    expect(expected.includes("Admin")).toBe(account.role === "admin");

    // Every area in the navigation opens, each with the caution in the footer.
    for (const item of NAV_ITEMS.filter((i) => expected.includes(i.label) && i.href !== "/dashboard")) {
      await nav.getByRole("link", { name: item.label, exact: true }).click();
      await page.waitForURL(`**${item.href}`);
      await expect(page.getByTestId("page-title")).toBeVisible();
      await expect(footerCaution).toBeVisible();
    }

    // The people page itself answers only administrators.
    const res = await page.goto("/admin/users");
    if (account.role === "admin") {
      expect(res?.status()).toBe(200);
      await expect(page.getByTestId("page-title")).toHaveText("People");
      await expect(page.getByTestId(`user-row-${account.email}`)).toBeVisible();
    } else {
      expect(res?.status()).toBe(404);
      await expect(page.getByTestId("not-found")).toBeVisible();
    }
  });
}

test("signing out ends the session", async ({ page }) => {
  await signInUi(page, "engineer@lanternfell.example");
  await page.getByTestId("user-menu").click();
  await page.getByTestId("sign-out").click();
  await expect(page.getByTestId("sign-in-notice")).toHaveText("You are signed out.");
  await page.goto("/dashboard");
  await expect(page).toHaveURL(/\/sign-in/);
});
