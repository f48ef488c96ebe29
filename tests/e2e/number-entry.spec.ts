import { expect, test } from "@playwright/test";
import { demoAccount } from "@/lib/auth/demo-accounts";
import { apiAs, signInUi } from "./support/auth";

// The one number field: a decimal comma is read as a decimal (2,5 = 2.5), an ambiguous "1,234" is refused
// with a message naming the field, and nothing is stored until the value is clear.
// Source: ISO 80000-1:2009 §7.3.2 (comma or point as the decimal sign; no comma grouping of digits).
test("a scenario's entry speed typed as 2,5 is stored as 2.5 m/s; 1,234 is refused with a message", async ({ page }) => {
  test.setTimeout(60_000);
  await signInUi(page, demoAccount("engineer").email);
  await page.goto("/scenarios/new");
  const form = page.getByTestId("scenario-form");
  await expect(form).toBeVisible();
  await page.locator("#f-name").fill(`Decimal comma ${Date.now()}`);
  const lift = page.locator("#f-liftId");
  await expect(lift.locator("option")).not.toHaveCount(1);
  await lift.selectOption({ index: 1 });
  const train = page.locator("#f-trainId");
  await expect(train.locator("option")).not.toHaveCount(1);
  await train.selectOption({ index: 1 });

  const speed = page.locator("#f-entrySpeed");
  await speed.fill("1,234");
  await expect(page.getByTestId("error-entrySpeed")).toContainText('Entry speed: "1,234" could be read two ways');
  await page.getByTestId("save-scenario").click();
  await expect(page.getByTestId("save-banner")).toContainText("Nothing was saved");
  await expect(page).toHaveURL(/\/scenarios\/new$/);

  await speed.fill("2,5");
  await expect(page.getByTestId("error-entrySpeed")).toHaveCount(0);
  await page.getByTestId("save-scenario").click();
  await page.waitForURL(/\/scenarios\/\d+$/);
  const id = new URL(page.url()).pathname.split("/").pop();
  const api = await apiAs(demoAccount("engineer").email);
  const res = await api.get(`/api/scenarios/${id}`);
  expect(res.status()).toBe(200);
  expect(((await res.json()) as { entrySpeed: number }).entrySpeed).toBe(2.5);
  await api.dispose();
});
