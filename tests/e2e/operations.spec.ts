import { expect, test, type Page } from "@playwright/test";
import { demoAccount } from "@/lib/auth/demo-accounts";
import { signInUi } from "./support/auth";

// Lift operations in real Chromium, as the park's operator: the emergency stop demo (settle-back onto the ARD
// and restart) read through its replay and its account, then the two-train dispatch demo with both trains.

async function openDemo(page: Page, search: string) {
  await page.goto("/scenarios");
  await page.getByTestId("scenario-table-search").fill(search);
  await expect(page.getByTestId("scenario-table-row")).toHaveCount(1);
  await page.getByTestId("scenario-table").getByRole("link").first().click();
  await expect(page.getByTestId("run-view")).toBeVisible();
  // The seeded run opens from its stored result.
  await expect(page.getByTestId("run-results")).toHaveAttribute("data-origin", "server");
}

test.describe("operations: a stop on the lift and several trains", () => {
  test("an operator goes to the ARD catch after the emergency stop, reads why, then sees both trains of the dispatch demo", async ({ page }) => {
    test.setTimeout(90_000);
    await signInUi(page, demoAccount("operator").email);
    await openDemo(page, "emergency stop");

    // The stop's own line under the headline figures: peak ARD force, rollback, restart to pick-up.
    const stopLine = page.getByTestId("line-stop-0");
    await expect(stopLine).toContainText("brake stop at 15.00 s");
    await expect(stopLine).toContainText(/peak ARD force [\d.]+ kN/);
    await expect(stopLine).toContainText(/rollback [\d.]+ mm/);
    await expect(stopLine).toContainText(/restart → pick-up [\d.]+ s/);

    // Go to the catch: the replay stops at the time the account gives for it.
    const account = page.getByTestId("stop-account-text");
    const caught = /The ARD caught it at ([\d.]+) s/.exec((await account.textContent()) ?? "");
    expect(caught).not.toBeNull();
    await page.getByTestId("go-to-stop-catch").click();
    await expect(page.getByTestId("replay-time")).toContainText(Number(caught![1]).toFixed(2));
    // The account is marked as the one the replay is at.
    await expect(page.getByTestId("stop-account")).toHaveClass(/ring-2/);

    // The inequality in words with its numbers.
    const text = (await account.textContent()) ?? "";
    const m = /v·√\(k·m\) = ([\d.]+) m\/s × √\(([\d,]+) kN\/m × ([\d,]+) kg\) = ([\d.]+) kN about the load the dog carries, F = ([\d.]+) kN: ([\d.]+) kN > ([\d.]+) kN, so the dog unloaded and the train rolled back (\d+) mm onto the ARD/.exec(text);
    expect(m, text).not.toBeNull();
    const [v, k, mass, swing, F, lhs, rhs, rolled] = m!.slice(1).map((s) => Number(s.replace(/,/g, "")));
    // Source: Rao, Mechanical Vibrations — a spring–mass stopped at speed v swings its force by v·√(k·m):
    // the product of the shown figures (k in kN/m → N/m) gives the shown swing, to the rounding of k.
    expect((v! * Math.sqrt(k! * 1000 * mass!)) / 1000).toBeCloseTo(swing!, 0);
    // Source: statics on an incline (Meriam & Kraige, Engineering Mechanics: Statics) — the load on the dog is
    // m·g·(sin θ + C_rr·cos θ) with m = 6 cars × (1000 kg + 4 × 75 kg) = 7800 kg, θ = 40°, C_rr = 0.015
    // (the demo train and lift, lib/demo/park.ts): 7800 × 9.80665 × (0.6428 + 0.0115) = 50.1 kN.
    expect(mass).toBe(7800);
    expect(Math.abs(F! - 50.1) / 50.1).toBeLessThan(0.02);
    expect([lhs, rhs]).toEqual([swing, F]);
    expect(swing!).toBeGreaterThan(F!);
    expect(rolled!).toBeGreaterThan(0);
    await expect(account).toContainText(/The drive restarted at 22\.00 s; the dog carried the train again [\d.]+ s later/);

    // The dispatch demo: two trains, each with its own figures and plot lines.
    await openDemo(page, "two-train dispatch");
    const first = page.getByTestId("line-train-1");
    const second = page.getByTestId("line-train-2");
    await expect(first).toContainText(/Train 1: dog engages at [\d.]+ s · released at the crest at [\d.]+ s/);
    await expect(second).toContainText(/Train 2: dog engages at [\d.]+ s/);
    const engaged2 = Number(/Train 2: dog engages at ([\d.]+) s/.exec((await second.textContent()) ?? "")![1]);
    const released1 = Number(/released at the crest at ([\d.]+) s/.exec((await first.textContent()) ?? "")![1]);
    // The second train is picked up while the first is still on the chain (the demo's point).
    expect(engaged2).toBeLessThan(released1);
    await expect(page.getByTestId("plot-forces")).toContainText("train 2");
  });

  test("an engineer sees the trains, the stop and the restart on the editor's timeline, and a restart before the stop is refused", async ({ page }) => {
    test.setTimeout(60_000);
    await signInUi(page, demoAccount("engineer").email);
    await openDemo(page, "two-train dispatch");
    await page.getByTestId("edit-scenario").locator("summary").click();
    await expect(page.getByTestId("follower-0")).toBeVisible();
    await expect(page.getByTestId("lift-timeline")).toContainText("train 1 at 0.0 s · train 2 at 12.0 s");

    await openDemo(page, "emergency stop");
    await page.getByTestId("edit-scenario").locator("summary").click();
    const timeline = page.getByTestId("lift-timeline");
    await expect(page.getByTestId("timeline-stop")).toContainText("stop at 15.0 s, brake in 0.3 s");
    await expect(page.getByTestId("timeline-restart")).toContainText("restart at 22.0 s");
    // The strip follows the field; the server refuses a restart before the stop with the field named, and
    // nothing is saved (the page still shows 22 s after a reload).
    const restart = page.locator("#f-dynamics-drive-restart-time");
    await restart.fill("10");
    await expect(timeline).toContainText("restart at 10.0 s");
    await page.getByTestId("save-scenario").click();
    await expect(page.getByTestId("save-banner")).toContainText("The server did not accept the scenario");
    await expect(page.getByTestId("error-dynamics.drive.restart.time")).toContainText("Restart at must be later than");
    await page.reload();
    await page.getByTestId("edit-scenario").locator("summary").click();
    await expect(page.getByTestId("timeline-restart")).toContainText("restart at 22.0 s");
  });
});
