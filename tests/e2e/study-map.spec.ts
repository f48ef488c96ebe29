import { expect, test } from "@playwright/test";
import { apiAs, signInUi } from "./support/auth";

/**
 * The demo study's operating map (entry speed 1.0–3.5 m/s × empty / full train, lib/studies/seed.ts) read
 * in SI and in US customary: both axes named, the speed axis with its unit in the reader's system, ticks
 * converted, and no SI unit left on the map for a US reader. The viewer account switches units and back.
 */
test("the operating map names its axes with units in both unit systems", async ({ page }) => {
  // Two page loads of a study and two profile writes: more than the default 30 s on a busy machine.
  test.setTimeout(90_000);
  const api = await apiAs("viewer@lanternfell.example");
  const setUnits = async (units: "si" | "us") => expect((await api.patch("/api/me", { data: { units } })).ok()).toBe(true);
  await setUnits("si");
  try {
    await signInUi(page, "viewer@lanternfell.example");
    await page.goto("/studies");
    await page.getByRole("link", { name: "Emberline: entry speed window, empty and full" }).click();
    await page.waitForURL(/\/studies\/\d+$/);
    const map = page.getByTestId("operating-map");
    await expect(map.getByTestId("map-canvas")).toBeVisible();
    await expect(map.getByTestId("map-x-axis")).toHaveText("Entry speed (m/s)");
    await expect(map.getByTestId("map-y-axis")).toHaveText("Train loading");
    await expect(map.getByTestId("map-x-ticks")).toHaveText(/^1\.001\.502\.002\.503\.003\.50$/);
    await expect(map.getByTestId("map-y-ticks")).toContainText("empty");
    await expect(map.getByTestId("map-legend")).toContainText("recommended window");
    await expect(page.getByTestId("study-window")).toContainText(/Recommended window: entry speed|No case of this study is safe/);

    await setUnits("us");
    await page.reload();
    // Source: 1 ft = 0.3048 m exactly: 1.0 m/s = 3.28 ft/s, 3.5 m/s = 11.48 ft/s.
    await expect(map.getByTestId("map-x-axis")).toHaveText("Entry speed (ft/s)");
    await expect(map.getByTestId("map-y-axis")).toHaveText("Train loading");
    await expect(map.getByTestId("map-x-ticks")).toHaveText(/^3\.28.*11\.48$/);
    await expect(map).not.toContainText("m/s");
    await expect(page.getByTestId("study-window")).not.toContainText("m/s");
  } finally {
    await setUnits("si");
    await api.dispose();
  }
});
