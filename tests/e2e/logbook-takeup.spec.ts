import { expect, test } from "@playwright/test";
import { apiAs, signInUi } from "./support/auth";
import { query } from "./support/db";
import { waitForMail } from "./support/mail";

// An operator logs a take-up reading past the end of the usable travel: the logbook shows the alert, the
// park's ride engineer gets one e-mail (read from the mail fake) and the dashboard lists it.
test("an operator logs a take-up reading that raises an alert", async ({ page }) => {
  const [lift] = await query<{ id: number; name: string }>(
    "SELECT l.id, l.name FROM lifts l JOIN organisations o ON o.id = l.organisation_id WHERE o.slug = 'lanternfell' AND l.name = 'Foxglove lift hill'",
  );
  const api = await apiAs("operator@lanternfell.example");
  // Removing links clears any take-up alert left by an earlier run of this test on the same database.
  expect((await api.post("/api/logbook/entries", { data: { kind: "links-removed", liftId: lift.id, links: 2 } })).status()).toBe(201);
  const trend = (await (await api.get(`/api/logbook/lifts/${lift.id}`)).json()) as { takeUp: { limit: number }; travel: number };
  const mm = Math.round(trend.takeUp.limit * 1000) + 5;
  expect(mm / 1000).toBeLessThanOrEqual(trend.travel);

  await signInUi(page, "operator@lanternfell.example");
  await page.goto(`/logbook?lift=${lift.id}`);
  await expect(page.getByTestId("take-up-chart")).toBeVisible();
  await page.locator("#kind").selectOption("take-up");
  // Numbers are read as in every form: an ambiguous "1,234" is refused by the field's name and unit and
  // nothing is stored; a decimal comma reads as a decimal point (mm + 0.4 shows as mm).
  const entriesBefore = await page.getByTestId("entries").textContent();
  await page.locator("#position").fill("1,234");
  await page.getByTestId("save-entry").click();
  await expect(page.getByTestId("entry-message")).toHaveText("Check the marked fields.");
  await expect(page.getByText('Position: "1,234" could be read two ways; type 1.234 or 1234 without a thousands separator (mm)')).toBeVisible();
  expect(await page.getByTestId("entries").textContent()).toBe(entriesBefore);
  await page.locator("#position").fill(`${mm},4`);
  await page.getByTestId("save-entry").click();
  await expect(page.getByTestId("entry-message")).toHaveText("Saved.");
  await expect(page.getByTestId("raised-alerts")).toContainText("end of its usable travel");
  await expect(page.getByTestId("entries")).toContainText(`${mm} mm below the top stop`);

  const mail = await waitForMail("engineer@lanternfell.example", `Limit reached: ${lift.name}`);
  expect(mail.text).toContain(`${mm} mm below the top stop`);

  // Other browser tests invite more engineers into the park, so count the active ones the alert must reach.
  const engineers = await query<{ n: number | bigint }>(
    "SELECT COUNT(*) AS n FROM users u JOIN organisations o ON o.id = u.organisation_id WHERE o.slug = 'lanternfell' AND u.role = 'engineer' AND u.active = 1",
  );
  await page.goto("/dashboard");
  await expect(page.getByTestId("alerts-panel")).toContainText(lift.name);
  await expect(page.getByTestId("alerts-panel")).toContainText(`e-mailed to ${Number(engineers[0].n)} engineer(s)`);
});
