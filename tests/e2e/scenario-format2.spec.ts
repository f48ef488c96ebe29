import { expect, test } from "@playwright/test";
import { demoAccount } from "@/lib/auth/demo-accounts";
import { apiAs, signInUi } from "./support/auth";

// Scenario format 2 in the workspace: the editor's drive model fields and a version 2 export that
// imports back to the same scenario (real Chromium, real MariaDB, the seeded demo park).
test.describe("scenario format 2", () => {
  test("the editor shows the drive model, its fields with units and help, and the schema's message with label and unit", async ({ page }) => {
    test.setTimeout(90_000); // many steps on one page (sign-in, scenario page with its saved run, editor)
    await page.setViewportSize({ width: 1440, height: 900 });
    await signInUi(page, demoAccount("engineer").email);
    await page.goto("/scenarios");
    await page.getByTestId("scenario-table-search").fill("clean pick-up");
    await expect(page.getByTestId("scenario-table-row")).toHaveCount(1);
    await page.getByTestId("scenario-table").getByRole("link").first().click();
    await page.getByTestId("edit-scenario").locator("summary").click();
    const section = page.getByTestId("dynamics-section");
    await expect(section).toBeVisible();
    await expect(page.getByTestId("drive-model")).toBeVisible();
    await expect(page.getByTestId("drive-location")).toBeVisible();
    await expect(page.getByTestId("drive-stop")).toBeVisible();
    // Damping and contact fields with their units.
    await expect(page.getByTestId("unit-dynamics.takeUp.damping")).toHaveText("N·s/m");
    await expect(page.getByTestId("unit-dynamics.takeUp.friction")).toHaveText("kN");
    await expect(page.getByTestId("unit-dynamics.chain.damping")).toHaveText("N·s");
    await expect(page.getByTestId("unit-dynamics.contacts.dogStiffness")).toHaveText("kN/m");
    await expect(page.getByTestId("unit-startTime")).toHaveText("s");

    // Choosing the induction motor shows its fields; a slip beyond the format's bound is refused in words.
    await page.getByTestId("drive-model").selectOption("induction");
    await expect(page.getByTestId("unit-dynamics.drive.motor.ratedPower")).toHaveText("kW");
    await expect(section.getByText("Rated slip", { exact: true })).toBeVisible();
    await expect(section.getByText(/slip curve \(Kloss\)/)).toBeVisible();
    await page.locator("#f-dynamics-drive-motor-ratedSlip").fill("0.5");
    await expect(page.getByTestId("error-dynamics.drive.motor.ratedSlip")).toContainText("Rated slip");
    // In words, with the label and the bound, never the internal path.
    await expect(page.getByTestId("error-dynamics.drive.motor.ratedSlip")).toHaveText("Rated slip must be at most 0.2");
    await page.getByTestId("save-scenario").click();
    await expect(page.getByTestId("save-banner")).toContainText("Some fields need attention");

    // Speed loop: its own fields (bandwidth in Hz).
    await page.getByTestId("drive-model").selectOption("speed-loop");
    await expect(page.getByTestId("unit-dynamics.drive.motor.bandwidth")).toHaveText("Hz");
    // The run view explains the drive model and the damping of the shown run.
    await expect(page.getByTestId("drive-damping")).toBeVisible({ timeout: 20_000 });
    await expect(page.getByTestId("drive-damping-drive")).toContainText(/Drive: (induction motor|speed loop|ideal)/);
    await expect(page.getByTestId("drive-damping-chain")).toContainText("Loss factor");
    await page.screenshot({ path: "tests/artifacts/scenario-format2-editor-1440.png", fullPage: false });
  });

  test("an export writes format 2 and imports back to the same scenario", async () => {
    const engineer = await apiAs(demoAccount("engineer").email);
    try {
      const list = await (await engineer.get("/api/scenarios?q=clean%20pick-up")).json();
      const id = list.items[0].id as number;
      const file = await (await engineer.get(`/api/scenarios/${id}/export`)).json();
      expect(file.format).toBe("tautline-scenario/2");
      expect(Array.isArray(file.trains)).toBe(true);
      expect(file.trains).toHaveLength(1);
      expect(file.train).toBeUndefined();
      expect(file.drive.motor.kind).toBe("induction");
      const name = `Round trip ${Date.now()}`;
      const imported = await engineer.post("/api/scenarios/import", { data: { ...file, name } });
      expect(imported.status()).toBe(201);
      const { scenario } = await imported.json();
      const again = await (await engineer.get(`/api/scenarios/${scenario.id}/export`)).json();
      expect(again).toEqual({ ...file, name });

      // A bad new field: 400 with its path and unit, nothing created.
      const bad = await engineer.post("/api/scenarios/import", {
        data: { ...file, name: `${name} bad`, takeUp: { ...file.takeUp, damping: -1 } },
      });
      expect(bad.status()).toBe(400);
      const body = await bad.json();
      expect(body.issues).toEqual(expect.arrayContaining([expect.objectContaining({ path: "takeUp.damping", message: expect.stringMatching(/takeUp\.damping must be at least 0 \(N·s\/m\)/) })]));
      // Nothing stored: no scenario (nor its lift) under the refused file's name.
      expect((await (await engineer.get(`/api/scenarios?q=${encodeURIComponent(`${name} bad`)}`)).json()).total).toBe(0);
      expect((await (await engineer.get(`/api/lifts?q=${encodeURIComponent(`${name} bad`)}`)).json()).total).toBe(0);
    } finally {
      await engineer.dispose();
    }
  });
});
