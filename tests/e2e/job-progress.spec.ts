import fs from "node:fs";
import path from "node:path";
import { expect, test, type APIRequestContext } from "@playwright/test";
import { apiAs, signInUi } from "./support/auth";

/**
 * A job's page follows its progress by its event stream in real Chromium: a dropped stream is opened again
 * and the page still reaches the result; a stream the server refuses ends in a clear error. The run waits in
 * the queue behind a long run of the same organisation (one engine worker, the default), so it is still
 * waiting while the page opens; the long run is cancelled as soon as that is checked.
 */
const example = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "..", "sim", "examples", "lift-hill-example.json"), "utf8"));
const ACCOUNT = "engineer@cardlevane.example";

let api: APIRequestContext;
let scenarioId = 0;

test.beforeAll(async () => {
  api = await apiAs(ACCOUNT);
  const imported = await api.post("/api/scenarios/import", {
    data: { ...example, name: `Progress stream ${Date.now()} ${process.pid}`, run: { ...example.run, duration: 8, segments: 30 } },
  });
  expect(imported.status()).toBe(201);
  scenarioId = (await imported.json()).scenario.id;
});

test.afterAll(async () => {
  await api?.dispose();
});

test("a saved run's page opens its dropped event stream again and reaches the result; a refused stream says why", async ({ page }) => {
  test.setTimeout(90_000);
  // Minutes of engine time each (600 s simulated on 1000 segments): they hold the organisation's share until cancelled.
  const longIds: number[] = [];
  const cancelLong = async () => {
    for (const id of longIds) await api.post(`/api/runs/${id}/cancel`);
  };
  try {
    for (let i = 0; i < 2; i++) {
      const long = await api.post(`/api/scenarios/${scenarioId}/runs`, { data: { duration: 600, segments: 1000, budgetSeconds: 120, frameBudget: 10 } });
      expect(long.status()).toBe(202);
      longIds.push(((await long.json()) as { run: { id: number } }).run.id);
    }
    const waiting = await api.post(`/api/scenarios/${scenarioId}/runs`, { data: { frameBudget: 50 } });
    expect(waiting.status()).toBe(202);
    const runId = ((await waiting.json()) as { run: { id: number } }).run.id;

    // The first stream is cut as it opens; later ones reach the server.
    let opened = 0;
    await page.route(`**/api/runs/${runId}/events`, async (route) => {
      opened += 1;
      if (opened === 1) await route.abort("connectionreset");
      else await route.continue();
    });
    await signInUi(page, ACCOUNT);
    await page.goto(`/runs/${runId}`);
    await expect(page.getByTestId("saved-run-status")).toHaveText(/queued|running/);
    // Source: WHATWG HTML Living Standard §9.2 (a dropped event stream is reconnected).
    await expect.poll(() => opened).toBeGreaterThanOrEqual(2);

    // A second page whose stream the server refuses: the page names the server's reason.
    const refused = await page.context().newPage();
    await refused.route(`**/api/runs/${runId}/events`, (route) =>
      route.fulfill({ status: 404, contentType: "application/json", body: JSON.stringify({ error: "Run not found." }) }),
    );
    await refused.goto(`/runs/${runId}`);
    await expect(refused.getByTestId("saved-run-error")).toHaveText("Run not found.");
    await refused.close();

    await cancelLong();
    await expect(page.getByTestId("saved-run-status")).toHaveText("done", { timeout: 60_000 });
    await expect(page.getByTestId("saved-run-error")).toHaveCount(0);
  } finally {
    await cancelLong();
  }
});
