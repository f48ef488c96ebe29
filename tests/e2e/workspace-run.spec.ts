import { expect, test, type Page } from "@playwright/test";
import { demoAccount } from "@/lib/auth/demo-accounts";
import { signInUi } from "./support/auth";

const SETTLE_BACK = "settles back onto the ARD";

async function openSettleBackScenario(page: Page) {
  await page.goto("/scenarios");
  await page.getByTestId("scenario-table-search").fill(SETTLE_BACK);
  await expect(page.getByTestId("scenario-table-row")).toHaveCount(1);
  await page.getByTestId("scenario-table").getByRole("link").first().click();
  await expect(page.getByTestId("run-view")).toBeVisible();
}

/** "161.3 kN" → 161.3 */
const kN = (text: string | null) => Number((text ?? "").replace(/[^\d.]/g, ""));

test.describe("workspace: run view", () => {
  test.describe.configure({ mode: "serial" });
  let savedRunPath = "";

  test("an engineer runs the settle-back scenario in the browser, reads the ARD catch and the peak, and saves the run", async ({ page }) => {
    test.setTimeout(90_000);
    await page.setViewportSize({ width: 1440, height: 900 });
    await signInUi(page, demoAccount("engineer").email);
    await openSettleBackScenario(page);

    // A saved run of the demo opens at once from its stored result.
    await expect(page.getByTestId("run-results")).toHaveAttribute("data-origin", "server");

    await page.getByTestId("run-in-browser").click();
    await expect(page.getByTestId("run-view")).toHaveAttribute("data-status", "done", { timeout: 30_000 });
    await expect(page.getByTestId("run-results")).toHaveAttribute("data-origin", "browser");
    // The worker reported progress on the way (about every 1 %).
    expect(Number(await page.getByTestId("run-view").getAttribute("data-progress-events"))).toBeGreaterThan(20);

    // The ARD catch in the headline figures, and the plain-language account.
    const rollback = page.getByTestId("check-rollback");
    await expect(rollback).toContainText(/[1-9]\d* ARD catch/);
    await expect(rollback).toHaveAttribute("data-state", /fail|caution/);
    await expect(rollback).toContainText(/Fail|Caution/);
    await expect(page.getByTestId("reason-rollback")).toContainText("settled back onto the ARD");
    const account = page.getByTestId("settle-back-text");
    await expect(account).toContainText("reached the chain at 4.50 m/s");
    await expect(account).toContainText(/stretch \d+ mm over its [\d.]+ m of loaded length/);
    await expect(account).toContainText("rested on the ARD");
    await expect(page.getByTestId("safety-caution").first()).toContainText("qualified engineer");

    // Scrub to the peak tension: the plot cursor reads the same peak as the headline figure.
    await page.getByTestId("event-peak").click();
    const peakHeadline = kN(await page.getByTestId("figure-snatch").textContent());
    const cursor = kN(await page.getByTestId("cursor-max-tension").textContent());
    expect(peakHeadline).toBeGreaterThan(0);
    expect(Math.abs(cursor - peakHeadline) / peakHeadline).toBeLessThan(0.05);
    // The chain tension at the dog: its own line beside the drive's, in the read-out, never above the highest.
    await expect(page.getByTestId("plot-tension")).toContainText("At the dog");
    await expect(page.getByTestId("plot-note-tension")).toContainText("just ahead of the dog's catch point");
    const atDog = kN(await page.getByTestId("cursor-dog-tension").textContent());
    expect(atDog).toBeGreaterThan(0);
    expect(atDog).toBeLessThanOrEqual(cursor * 1.02);
    const t = Number((await page.getByTestId("replay-time").textContent())!.replace(/[^\d.]/g, ""));
    expect(Number(await page.getByTestId("cursor-time").textContent())).toBeCloseTo(t, 1);
    await expect(page).toHaveURL(/[?&]t=\d+\.\d\d/);

    // Replay controls: step a frame, keyboard speed change.
    await page.getByTestId("replay-next").click();
    await page.keyboard.press("]");
    await expect(page.getByTestId("replay-speed")).toHaveValue("2");
    await page.getByTestId("event-ard").first().click();
    // Screenshots without the sticky top bar, which would otherwise cover element shots.
    const unstick = await page.addStyleTag({ content: "header.sticky, aside.sticky { position: static !important; }" });
    await page.screenshot({ path: "tests/artifacts/workspace-run-view-1440.png", fullPage: true });
    await page.getByTestId("replay").screenshot({ path: "tests/artifacts/workspace-replay-1440.png" });
    await page.setViewportSize({ width: 834, height: 1112 });
    await page.waitForTimeout(300);
    await page.screenshot({ path: "tests/artifacts/workspace-run-view-tablet.png", fullPage: true });
    await page.getByTestId("replay").screenshot({ path: "tests/artifacts/workspace-replay-tablet.png" });
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(1);
    await unstick.evaluate((el) => (el as Element).remove());
    await page.setViewportSize({ width: 1440, height: 900 });

    // Save = start the same scenario on the server; it opens when done, and again after a reload.
    await page.getByTestId("save-run").click();
    await page.waitForURL(/\/runs\/\d+/);
    await expect(page.getByTestId("saved-run-status")).toHaveText("done", { timeout: 60_000 });
    await expect(page.getByTestId("run-results")).toHaveAttribute("data-origin", "server");
    await expect(page.getByTestId("check-rollback")).toContainText(/[1-9]\d* ARD catch/);
    // Sliders untouched: a plain run of the scenario, not a what-if variant.
    await expect(page.getByTestId("saved-run-whatif")).toHaveCount(0);
    savedRunPath = new URL(page.url()).pathname;
    await page.reload();
    await expect(page.getByTestId("run-results")).toHaveAttribute("data-origin", "server");
    await expect(page.getByTestId("settle-back")).toBeVisible();
  });

  test("what-if sliders preview quickly, the full run follows, and the what-if run saves as a marked variant", async ({ page }) => {
    test.setTimeout(90_000);
    await signInUi(page, demoAccount("engineer").email);
    await openSettleBackScenario(page);
    await expect(page.getByTestId("run-results")).toBeVisible();
    const slider = page.getByTestId("whatif-entrySpeed");
    await slider.focus();
    // Ten steps of 0.05 m/s down from the scenario's 4.50 m/s.
    for (let i = 0; i < 10; i++) await page.keyboard.press("ArrowLeft");
    await expect(page.getByTestId("whatif-entrySpeed-value")).toContainText("4.00 m/s");
    await expect(page.getByTestId("whatif-latency")).toContainText(/last preview \d+ ms/, { timeout: 20_000 });
    await expect(page.getByTestId("run-results")).toHaveAttribute("data-origin", "browser", { timeout: 30_000 });

    // Save sends the moved value as an override; the server runs it and the saved run says it is a what-if.
    const save = page.getByTestId("save-run");
    await expect(save).toBeEnabled();
    await expect(save).toHaveAttribute("data-overrides", "entrySpeed");
    await save.click();
    await page.waitForURL(/\/runs\/\d+/);
    await expect(page.getByTestId("saved-run-status")).toHaveText("done", { timeout: 60_000 });
    await expect(page.getByTestId("run-results")).toHaveAttribute("data-origin", "server");
    await expect(page.getByTestId("saved-run-whatif")).toContainText("What-if variant");
    await expect(page.getByTestId("saved-run-override")).toHaveText("entry speed 4.00 m/s (scenario: 4.50 m/s)");
    await page.screenshot({ path: "tests/artifacts/workspace-whatif-run-1440.png" });
    const whatIfPath = new URL(page.url()).pathname;
    await page.reload();
    await expect(page.getByTestId("saved-run-override")).toHaveText("entry speed 4.00 m/s (scenario: 4.50 m/s)");

    // The scenario's runs list marks it, and the scenario still opens its own (plain) latest run.
    await page.getByRole("link", { name: "Open the scenario" }).click();
    const whatIfId = whatIfPath.split("/").pop()!;
    const item = page.getByTestId("saved-runs").locator("li", { has: page.getByRole("link", { name: `Run ${whatIfId}`, exact: true }) });
    await expect(item.getByTestId("saved-run-whatif")).toHaveText(/what-if/i);
    await expect(item.getByTestId("saved-run-whatif")).toHaveAttribute("title", /entry speed 4\.00 m\/s \(scenario: 4\.50 m\/s\)/);
    await expect(page.getByTestId("run-results")).toHaveAttribute("data-origin", "server");
    await expect(page.getByTestId("whatif-entrySpeed-value")).toHaveText("4.50 m/s");
    await expect(page.getByTestId("save-run")).toHaveText("Save run on the server");
  });

  test("a viewer sees the saved run read-only", async ({ page }) => {
    expect(savedRunPath).toMatch(/\/runs\/\d+/);
    await signInUi(page, demoAccount("viewer").email);
    await page.goto(savedRunPath);
    await expect(page.getByTestId("run-results")).toHaveAttribute("data-origin", "server");
    await expect(page.getByTestId("settle-back")).toBeVisible();
    await expect(page.getByTestId("cancel-server-run")).toHaveCount(0);
    // In US customary units the reasons quote kip and in, not kN and mm (then back to SI for other tests).
    const toggle = page.getByTestId("units-toggle");
    await page.getByTestId("user-menu").click();
    await toggle.getByRole("button", { name: /US/ }).click();
    try {
      await expect(page.getByTestId("reason-rollback")).toContainText(/peak [\d.,]+ kip, [\d.,]+ in back/);
      await expect(page.getByTestId("reason-snatch")).toContainText("kip");
      await expect(page.getByTestId("headline-figures")).not.toContainText(/\d (kN|mm|kW)\b/);
    } finally {
      if (!(await toggle.isVisible())) await page.getByTestId("user-menu").click();
      await toggle.getByRole("button", { name: /SI/ }).click();
      await expect(toggle.getByRole("button", { name: /SI/ })).toHaveAttribute("aria-pressed", "true");
    }
    await page.getByRole("link", { name: "Open the scenario" }).click();
    await expect(page.getByTestId("read-only-note")).toContainText("Read only");
    await expect(page.getByTestId("run-in-browser")).toHaveCount(0);
    await expect(page.getByTestId("save-run")).toHaveCount(0);
    await expect(page.getByTestId("what-if")).toHaveCount(0);
    await expect(page.getByTestId("edit-scenario")).toHaveCount(0);
  });
});
