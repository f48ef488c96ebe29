import { expect, test } from "@playwright/test";
import { demoAccount } from "@/lib/auth/demo-accounts";
import { signInUi } from "./support/auth";

// The lift editor's Profile section against the seeded demo park (real Chromium, real MariaDB).
test.describe("lift editor: profile", () => {
  test("shows a lift's pieces, names a kinked join beside the field, imports survey points with the fit's residual", async ({ page }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await signInUi(page, demoAccount("engineer").email);
    await page.goto("/lifts");
    await page.getByTestId("lift-table-search").fill("Thornwick");
    const table = page.getByTestId("lift-table");
    await expect(table.getByTestId("lift-table-row")).toHaveCount(1);
    await table.getByRole("link", { name: /Thornwick two-slope lift/ }).click();
    await expect(page.getByTestId("lift-form")).toBeVisible();
    await expect(page.getByTestId("profile-mode")).toHaveValue("pieces");
    await expect(page.getByTestId("profile-pieces").locator("[data-testid^=profile-piece-]")).toHaveCount(9);
    await expect(page.getByTestId("lift-preview").locator("svg")).toBeVisible();
    const previewBefore = await page.getByTestId("preview-figures").textContent();

    // A straight at 25° after an arc that ends at 20°: the join kinks. Source: the format (sim/README.md, "lift.profile").
    await page.locator("#f-lift-profile-2-angle").fill("25");
    await expect(page.getByTestId("error-lift.profile.2.angle")).toContainText("starts at 25° but the piece before ends at 20°: put an arc between them");
    await page.getByTestId("save-lift").click();
    await expect(page.getByTestId("save-banner")).toContainText("Some fields need attention");
    await page.locator("#f-lift-profile-2-angle").fill("20");
    await expect(page.getByTestId("error-lift.profile.2.angle")).toHaveCount(0);

    // Survey points of a level run, a 30° slope and a level top (x, z in m), with decimal commas and semicolons.
    const rows = ["distance;height"];
    for (let x = 0; x <= 120; x += 1) {
      const z = x < 20 ? 0 : x < 80 ? (x - 20) * Math.tan(Math.PI / 6) : 60 * Math.tan(Math.PI / 6);
      rows.push(`${x};${z.toFixed(3).replace(".", ",")}`);
    }
    await page.getByTestId("survey-file").setInputFiles({ name: "survey.csv", mimeType: "text/csv", buffer: Buffer.from(rows.join("\n")) });
    const fit = page.getByTestId("survey-fit");
    await expect(fit).toContainText("121 points");
    await expect(fit).toContainText("residual RMS");
    await expect(fit).toContainText("30°");
    // The fit's tolerance in the reader's units (100 mm by default); a coarser one refits at once.
    await expect(page.locator("#f-survey-tolerance")).toHaveValue("100");
    await page.locator("#f-survey-tolerance").fill("250");
    await expect(fit).toContainText("121 points");
    await page.locator("fieldset", { has: page.getByTestId("profile-mode") }).screenshot({ path: "tests/artifacts/lift-profile-section.png" });
    await page.getByTestId("apply-fit").click();
    await expect(page.getByTestId("survey-fit")).toHaveCount(0);
    await expect(page.getByTestId("preview-figures")).not.toHaveText(previewBefore ?? "");

    // Back to the parametric fields: the six fields appear again.
    await page.getByTestId("profile-mode").selectOption("parametric");
    await expect(page.locator("#f-lift-angle")).toBeVisible();
    await page.screenshot({ path: "tests/artifacts/lift-profile-1440.png", fullPage: false });
  });
});
