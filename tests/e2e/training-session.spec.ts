import { expect, test } from "@playwright/test";
import { apiAs, signInUi } from "./support/auth";
import { waitForMail } from "./support/mail";

// A trainer builds a session from a saved run with two captions and shares it; the park's viewer gets the
// e-mail, watches it read-only with the captions at their moments, and the trainer sees who watched.
test("a trainer builds a session with two captions and a viewer watches it", async ({ browser }) => {
  // Two people, a mail round trip and a run's replay loaded in the builder: more than the default 30 s on a
  // loaded machine.
  test.setTimeout(90_000);
  const title = `Pick-up in two steps ${Date.now().toString(36)}`;
  const trainer = await browser.newPage();
  await signInUi(trainer, "trainer@lanternfell.example");
  await trainer.goto("/replays");
  await trainer.locator("#new-title").fill(title);
  await trainer.getByTestId("create-session").click();
  await trainer.waitForURL("**/replays/*/edit");
  await trainer.getByTestId("add-run").click();
  await trainer.getByTestId("add-caption-0").click();
  await trainer.locator("#cap-at-0-0").fill("1");
  await trainer.locator("#cap-text-0-0").fill("The drive starts: the chain tightens.");
  await trainer.getByTestId("add-caption-0").click();
  await trainer.locator("#cap-at-0-1").fill("3");
  await trainer.locator("#cap-text-0-1").fill("Watch the counterweight drop here.");
  // A third caption pinned at a moment found in the run's replay: its time is the replay's time.
  await trainer.getByTestId("show-replay-0").click();
  await expect(trainer.getByTestId("pin-replay-0").getByTestId("replay-play")).toBeVisible({ timeout: 15_000 });
  for (let i = 0; i < 4; i++) await trainer.getByTestId("replay-next").click();
  const shown = /t = (\d+\.\d{2}) s/.exec((await trainer.getByTestId("replay-time").textContent()) ?? "")![1];
  expect(Number(shown)).toBeGreaterThan(0);
  await expect(trainer.getByTestId("pin-caption-0")).toHaveText(`Pin a caption at ${shown} s`);
  await trainer.getByTestId("pin-caption-0").click();
  await expect(trainer.locator("#cap-at-0-2")).toHaveValue(String(Number(shown)));
  await trainer.locator("#cap-text-0-2").fill("Pinned: the chain takes up the slack.");
  await trainer.getByTestId("save-session").click();
  await expect(trainer.getByTestId("session-message")).toContainText("Saved.");
  await trainer.getByTestId("share-session").click();
  await expect(trainer.getByTestId("session-message")).toContainText("Shared with the organisation's viewers");
  const sessionId = Number(/replays\/(\d+)\/edit/.exec(trainer.url())![1]);

  const mail = await waitForMail("viewer@lanternfell.example", `Replay session: ${title}`);
  expect(mail.text).toContain(`/replays/${sessionId}`);

  const viewer = await (await browser.newContext()).newPage();
  await signInUi(viewer, "viewer@lanternfell.example");
  await viewer.goto("/replays");
  await viewer.getByRole("link", { name: title }).click();
  await expect(viewer.getByTestId("session-player")).toBeVisible();
  await expect(viewer.getByText("Edit the session")).toHaveCount(0);
  await expect(viewer.getByTestId("caption-list").locator("li")).toHaveCount(3);
  await expect(viewer.getByTestId("caption")).toContainText("Captions appear here");
  await expect(viewer.getByTestId("replay-play")).toBeVisible({ timeout: 15_000 });
  // Jumping 3 s in reports the viewer's progress to the server.
  const viewed = viewer.waitForResponse((r) => r.url().endsWith(`/api/training/sessions/${sessionId}/views`) && r.request().method() === "POST");
  await viewer.getByRole("button", { name: "3.0 s" }).click();
  expect((await viewed).ok()).toBe(true);
  await expect(viewer.getByTestId("caption")).toHaveText("Watch the counterweight drop here.");
  await viewer.getByRole("button", { name: "1.0 s" }).click();
  await expect(viewer.getByTestId("caption")).toHaveText("The drive starts: the chain tightens.");

  // Read-only: the viewer's role may not change it.
  const api = await apiAs("viewer@lanternfell.example");
  expect((await api.patch(`/api/training/sessions/${sessionId}`, { data: { version: 0, title: "mine" } })).status()).toBe(403);
  // A caption beyond the end of its run is refused by the server, by its place and in seconds; nothing changes.
  const trainerApi = await apiAs("trainer@lanternfell.example");
  const saved = (await (await trainerApi.get(`/api/training/sessions/${sessionId}`)).json()) as { version: number; items: { runId: number; duration: number }[] };
  const beyond = await trainerApi.patch(`/api/training/sessions/${sessionId}`, {
    data: { version: saved.version, title, items: [{ runId: saved.items[0].runId, title: null, captions: [{ at: saved.items[0].duration + 1, text: "Too late" }] }] },
  });
  expect(beyond.status()).toBe(400);
  expect(JSON.stringify((await beyond.json()).issues)).toContain(`must be within the run's ${saved.items[0].duration} s`);
  const after = (await (await trainerApi.get(`/api/training/sessions/${sessionId}`)).json()) as { items: { captions: unknown[] }[] };
  expect(after.items[0].captions).toHaveLength(3);
  // Another organisation's viewer does not find it.
  const stranger = await apiAs("viewer@cardlevane.example");
  expect((await stranger.get(`/api/training/sessions/${sessionId}`)).status()).toBe(404);

  // The trainer's "Who watched what" reloads on Refresh; read it once its answer has arrived.
  await expect
    .poll(async () => {
      const answer = trainer.waitForResponse((r) => r.url().endsWith(`/api/training/sessions/${sessionId}/views`) && r.request().method() === "GET");
      await trainer.getByRole("button", { name: "Refresh" }).click();
      await answer;
      return trainer.getByTestId("session-builder").textContent();
    }, { timeout: 15_000 })
    .toContain("Joss Wrenfield");
});
