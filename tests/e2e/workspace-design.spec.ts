import { expect, test } from "@playwright/test";
import { demoAccount } from "@/lib/auth/demo-accounts";
import { signInUi } from "./support/auth";

// The design screens against the seeded demo park (real Chromium, real MariaDB).
test.describe("workspace: lifts", () => {
  test("an engineer sees a validation error, then saves a valid change as a new revision", async ({ page }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await signInUi(page, demoAccount("engineer").email);
    await page.goto("/lifts");
    const table = page.getByTestId("lift-table");
    await expect(table.getByTestId("lift-table-row").first()).toBeVisible();
    // Filter and sort run on the server.
    await page.getByTestId("lift-table-search").fill("Emberline");
    await expect(table.getByTestId("lift-table-row")).toHaveCount(1);
    await page.getByTestId("lift-table-search").fill("");
    await page.getByTestId("sort-name").click();
    await expect(table.locator("th[aria-sort=descending]")).toHaveCount(1);
    await page.getByTestId("lift-table-search").fill("Emberline");
    await table.getByRole("link").first().click();
    await expect(page.getByTestId("lift-form")).toBeVisible();
    await expect(page.getByTestId("lift-preview").locator("svg")).toBeVisible();
    await expect(page.getByTestId("unit-lift.inclineLength")).toHaveText("m");

    // An angle outside the engine's bounds: the shared schema's message appears beside the field.
    const angle = page.locator("#f-lift-angle");
    const before = Number(await angle.inputValue());
    await angle.fill("95");
    await expect(page.getByTestId("error-lift.angle")).toContainText("Lift angle must be at most 80 °");
    await page.getByTestId("save-lift").click();
    await expect(page.getByTestId("save-banner")).toContainText("Some fields need attention");

    // A valid change: the preview redraws and the save makes a new revision with its diff.
    const previewBefore = await page.getByTestId("preview-figures").textContent();
    const next = before === 39 ? 38.5 : 39;
    await angle.fill(String(next));
    await expect(page.getByTestId("error-lift.angle")).toHaveCount(0);
    await expect(page.getByTestId("preview-figures")).not.toHaveText(previewBefore ?? "");
    await page.getByPlaceholder("What changed and why (optional)").fill("Flatter lift angle (test)");
    await page.getByTestId("save-lift").click();
    await expect(page.getByTestId("save-banner")).toContainText(/Saved as revision \d+ \(1 field changed\)/);
    const history = page.getByTestId("revision-history");
    await expect(history.getByText("Flatter lift angle (test)").first()).toBeVisible();
    await expect(history.getByTestId("revision-diff")).toContainText("Lift angle");
    await expect(history.getByTestId("revision-diff")).toContainText(`${next} °`);
    await page.screenshot({ path: "tests/artifacts/workspace-lift-1440.png", fullPage: false });
  });

  test("a stale save answers 409 and is shown as such", async ({ page }) => {
    await signInUi(page, demoAccount("engineer").email);
    await page.goto("/lifts");
    await page.getByTestId("lift-table-search").fill("Foxglove");
    await page.getByTestId("lift-table").getByRole("link").first().click();
    await expect(page.getByTestId("lift-form")).toBeVisible();
    const id = Number(new URL(page.url()).pathname.split("/").pop());
    // Someone else saves first (same account, through the API).
    const cur = (await (await page.request.get(`/api/lifts/${id}`)).json()) as { version: number; currentRevision: { drive: { rampTime: number } } };
    const ramp = cur.currentRevision.drive.rampTime === 1.5 ? 1.6 : 1.5;
    const res = await page.request.patch(`/api/lifts/${id}`, { data: { version: cur.version, drive: { rampTime: ramp }, changeSummary: "Concurrent change (test)" } });
    expect(res.ok()).toBe(true);
    const ta = page.locator("#f-takeUp-mass");
    await ta.fill(String(Number(await ta.inputValue()) + 10));
    await page.getByTestId("save-lift").click();
    await expect(page.getByTestId("conflict-banner")).toContainText("Someone else saved this lift");
    await page.getByTestId("reload-latest").click();
    await expect(page.getByTestId("save-banner")).toContainText(`Loaded version ${cur.version + 1}`);
  });

  test("trains and scenarios list with sorting and filters", async ({ page }) => {
    await signInUi(page, demoAccount("engineer").email);
    await page.goto("/trains");
    await expect(page.getByTestId("train-table-row").first()).toBeVisible();
    await page.getByTestId("sort-cars").click();
    await expect(page.getByTestId("train-table").locator("th[aria-sort=ascending]")).toHaveCount(1);
    await page.goto("/scenarios");
    await expect(page.getByTestId("scenario-table-row").first()).toBeVisible();
    await page.getByTestId("scenario-table-search").fill("settles back");
    await expect(page.getByTestId("scenario-table-row")).toHaveCount(1);
  });

  test("a viewer reads a lift without edit controls", async ({ page }) => {
    await signInUi(page, demoAccount("viewer").email);
    await page.goto("/lifts");
    await expect(page.getByTestId("new-lift")).toHaveCount(0);
    await page.getByTestId("lift-table").getByRole("link").first().click();
    await expect(page.getByTestId("read-only-note")).toBeVisible();
    await expect(page.getByTestId("save-lift")).toHaveCount(0);
    await expect(page.locator("#f-lift-angle")).toBeDisabled();
  });
});

test("the dashboard lists recent runs with their headline figures and failed checks", async ({ page }) => {
  await signInUi(page, demoAccount("engineer").email);
  const recent = page.getByTestId("recent-runs");
  await expect(recent.getByTestId("recent-run").first()).toBeVisible();
  await expect(recent).toContainText(/peak [\d.]+ kN/);
  await expect(recent).toContainText("Fails:");
  await recent.getByRole("link").first().click();
  await expect(page).toHaveURL(/\/runs\/\d+/);
  await expect(page.getByTestId("saved-run")).toBeVisible();
});
