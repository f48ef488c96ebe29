import { expect, test } from "@playwright/test";
import { apiAs, signInUi } from "./support/auth";

/**
 * The studies screens in Chromium against next start and the seeded demo park (one finished study of
 * entry speed × loading, lib/studies/seed.ts): window, map, sortable table, exports, opening a case run,
 * and a small new study started from the form and followed to the end.
 */
test("an engineer reads the demo study and starts a new one", async ({ page }) => {
  // The new study first chooses its mesh (its first and last case at doubling meshes), then runs its cases at it.
  test.setTimeout(150_000);
  await signInUi(page, "engineer@lanternfell.example");
  await page.goto("/studies");
  const demo = page.getByRole("link", { name: "Emberline: entry speed window, empty and full" });
  await expect(demo).toBeVisible();
  await demo.click();
  await page.waitForURL(/\/studies\/\d+$/);
  await expect(page.getByTestId("study-progress")).toContainText("12 / 12 cases");
  await expect(page.getByTestId("study-window")).toContainText(/entry speed/i);
  await expect(page.getByTestId("study-case-row")).toHaveCount(12);
  await expect(page.getByTestId("study-map")).toBeVisible();
  await expect(page.getByTestId("study-line-plots").locator("canvas").first()).toBeVisible();
  await expect(page.getByTestId("study-line-plots").locator(".u-legend").first()).toContainText("full");
  await expect(page.getByText("never replace, review by a qualified engineer").first()).toBeVisible();

  // Sort by peak tension, descending on the second click: the first row then holds the largest value.
  const header = page.getByRole("columnheader", { name: /Peak tension/ });
  await header.click();
  await header.click();
  const col = await page.getByTestId("study-case-row").evaluateAll((rows) => {
    const headers = [...document.querySelectorAll('[data-testid="study-cases"] thead th')].map((h) => h.textContent ?? "");
    const i = headers.findIndex((h) => h.startsWith("Peak tension"));
    return rows.map((r) => Number(r.children[i]?.textContent));
  });
  expect(col[0]).toBe(Math.max(...col));

  // Exports.
  const id = Number(page.url().split("/").pop());
  const api = await apiAs("engineer@lanternfell.example");
  const csv = await api.get(`/api/studies/${id}/export?format=csv`);
  expect(csv.status()).toBe(200);
  const text = await csv.text();
  expect(text.split("\r\n")[0]).toContain("Entry speed (m/s)");
  expect(text.trim().split("\r\n")).toHaveLength(13);
  const xlsx = await api.get(`/api/studies/${id}/export?format=xlsx&units=us`);
  expect(xlsx.headers()["content-type"]).toContain("spreadsheetml");
  expect((await xlsx.body()).subarray(0, 2).toString()).toBe("PK"); // a zip container
  await api.dispose();

  // Any case opens in the workspace run view.
  await page.getByTestId("study-case-row").first().getByRole("link", { name: "Open" }).click();
  await page.waitForURL(/\/runs\/\d+$/);

  // A new three-case study from the form, followed to the end.
  await page.goto("/studies");
  await page.getByLabel("scenario").selectOption({ label: "Emberline: clean pick-up" });
  await page.getByLabel("study name").fill(`Browser study ${Date.now()}`);
  await page.getByLabel("from 1").fill("1.5");
  await page.getByLabel("to 1").fill("2.5");
  await page.getByLabel("step 1").fill("0.5");
  await page.getByLabel("segments").fill("16");
  await page.getByLabel("duration").fill("12");
  await page.getByTestId("study-start").click();
  await page.waitForURL(/\/studies\/\d+$/);
  await expect(page.getByTestId("study-progress")).toContainText("3 / 3 cases", { timeout: 120_000 });
  await expect(page.getByTestId("study-case-row")).toHaveCount(3);
  await expect(page.getByTestId("study-window")).not.toBeEmpty();
  // The cases ran at the mesh the study chose first, and the page says which.
  await expect(page.getByTestId("study-mesh")).toContainText(/Cases run at \d+ segments/);
});

test("a bad study definition is refused with the field named", async ({ page }) => {
  await signInUi(page, "engineer@lanternfell.example");
  await page.goto("/studies");
  await page.getByLabel("scenario").selectOption({ label: "Emberline: clean pick-up" });
  await page.getByLabel("from 1").fill("3");
  await page.getByLabel("to 1").fill("1");
  await page.getByLabel("step 1").fill("0.5");
  await page.getByTestId("study-start").click();
  await expect(page.getByTestId("study-form-error")).toContainText("Parameter 1, to: to must not be below from");
  await expect(page.getByTestId("study-form-error")).not.toContainText("parameters.0");
});
