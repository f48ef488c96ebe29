import { expect, test } from "@playwright/test";
import { signInUi } from "./support/auth";
import { query } from "./support/db";

// An operator uploads a logger CSV: a file with bad rows is refused with each problem listed, the fixed one
// is stored and opens on its page with the overlay; an engineer fits the chain to the seeded recording (a job
// in the engine pool: started, polled, shown).
test("a logger upload lists every problem, then stores the fixed file and overlays it", async ({ page }) => {
  await signInUi(page, "operator@lanternfell.example");
  await page.goto("/logbook/upload");
  const bad = "time_s,takeup_mm,speed\n0,0,2.2\n0.02,oops,2.2\n0.01,1,2.2\n";
  await page.locator("#file").setInputFiles({ name: "dispatch.csv", mimeType: "text/csv", buffer: Buffer.from(bad) });
  await expect(page.locator("#map-time")).toHaveValue("time_s");
  await page.locator("#map-takeUpPosition").selectOption("takeup_mm");
  await page.locator("#map-trainSpeed").selectOption("speed");
  await page.getByTestId("check-recording").click();
  const problems = page.getByTestId("recording-problems");
  await expect(problems).toContainText("2 problem(s); nothing was stored");
  await expect(problems).toContainText('line 3, column "takeup_mm": "oops" is not a number');
  await expect(problems).toContainText("line 4: time 0.01 does not increase");
  await expect(page.getByTestId("store-recording")).toBeDisabled();

  const rows = ["time_s,takeup_mm,speed"];
  for (let k = 0; k <= 300; k++) rows.push(`${(k * 0.02).toFixed(2)},${(k > 120 ? -8 * Math.sin((k - 120) / 15) : 0).toFixed(2)},${(k > 120 ? 2.5 : 2.2).toFixed(2)}`);
  await page.locator("#file").setInputFiles({ name: "dispatch-fixed.csv", mimeType: "text/csv", buffer: Buffer.from(rows.join("\n")) });
  await page.locator("#map-takeUpPosition").selectOption("takeup_mm");
  await page.locator("#map-trainSpeed").selectOption("speed");
  await page.getByTestId("check-recording").click();
  await expect(page.getByTestId("recording-checked")).toContainText("301 rows read without problems");
  await page.getByTestId("store-recording").click();
  await page.waitForURL("**/logbook/recordings/*");
  await expect(page.getByTestId("overlay-chart")).toBeVisible();
  await expect(page.getByTestId("overlay-shift")).toContainText("Aligned at engagement");
});

test("an engineer fits stiffness and damping to the seeded recording", async ({ page }) => {
  test.setTimeout(60_000);
  const [rec] = await query<{ id: number }>(
    "SELECT r.id FROM recordings r JOIN organisations o ON o.id = r.organisation_id WHERE o.slug = 'lanternfell' ORDER BY r.id LIMIT 1",
  );
  await signInUi(page, "engineer@lanternfell.example");
  await page.goto(`/logbook/recordings/${rec.id}`);
  await expect(page.getByTestId("overlay-chart")).toBeVisible();
  await page.locator("#cal-scenario").selectOption({ label: "Emberline: clean pick-up" });
  await page.getByTestId("run-calibration").click();
  const result = page.getByTestId("calibration-result");
  await expect(result).toBeVisible({ timeout: 45_000 });
  await expect(result).toContainText("Axial stiffness E·A");
  await expect(result).toContainText(/\d MN/); // the demo engineer reads SI
  await expect(result).toContainText("Fit: RMS residual / R²");
  await expect(result).toContainText("Emberline: clean pick-up");
  await expect(page.getByTestId("save-calibration")).toBeVisible();
  await expect(page.getByTestId("calibration-error")).toHaveCount(0);
  // A reload shows the latest fit again: it is stored with its job, not held by the page.
  await page.reload();
  await expect(page.getByTestId("calibration-result")).toBeVisible();
});

test("the fit is a job: the start answers 202 at once with a status to poll until done", async ({ page }) => {
  test.setTimeout(60_000);
  const [rec] = await query<{ id: number; lift_id: number }>(
    "SELECT r.id, r.lift_id FROM recordings r JOIN organisations o ON o.id = r.organisation_id WHERE o.slug = 'lanternfell' ORDER BY r.id LIMIT 1",
  );
  const [sc] = await query<{ id: number }>("SELECT id FROM scenarios WHERE lift_id = ? AND name = 'Emberline: clean pick-up'", [rec.lift_id]);
  await signInUi(page, "engineer@lanternfell.example");
  const started = Date.now();
  const res = await page.request.post(`/api/recordings/${rec.id}/calibrate`, { data: { scenarioId: Number(sc.id) } });
  expect(res.status()).toBe(202);
  const answeredMs = Date.now() - started;
  const { calibration } = (await res.json()) as { calibration: { id: number; status: string } };
  expect(calibration.status).toBe("queued");
  expect(res.headers().location).toBe(`/api/recordings/${rec.id}/calibration?calibrationId=${calibration.id}`);
  type Job = { status: string; progress: number; result: { fitted: { axialStiffness: number } } | null; wallTimeMs: number | null };
  const seen: { job: Job | null } = { job: null };
  await expect
    .poll(
      async () => {
        seen.job = ((await (await page.request.get(res.headers().location!)).json()) as { calibration: Job }).calibration;
        return seen.job.status;
      },
      { timeout: 45_000, intervals: [200] },
    )
    .toBe("done");
  const last = seen.job!;
  expect(last.progress).toBe(1);
  expect(last.result!.fitted.axialStiffness).toBeGreaterThan(0);
  // The answer did not wait for the fit (about 60 engine runs). Source: README "Overlay and calibration" (the fit is a job; the page shows it waiting).
  expect(answeredMs).toBeLessThan(Math.max(1500, last.wallTimeMs!));
  const bad = await page.request.post(`/api/recordings/${rec.id}/calibrate`, { data: { scenarioId: "x" } });
  expect(bad.status()).toBe(400);
  expect(((await bad.json()) as { issues: { path: string }[] }).issues.map((i) => i.path)).toContain("scenarioId");
});
