import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createSession, getSession, recordView, sessionProgress, shareSession, updateSession } from "@/lib/training/service";
import { getModels } from "@/models";
import { closeDb, expectHttpError } from "./design-fixtures";
import { opsFakes, opsWorld } from "./logbook-fixtures";

let fakes: Awaited<ReturnType<typeof opsFakes>>;
let w: Awaited<ReturnType<typeof opsWorld>>;
let other: Awaited<ReturnType<typeof opsWorld>>;

beforeAll(async () => {
  fakes = await opsFakes();
  w = await opsWorld("train", { run: true });
  other = await opsWorld("train-other");
});
afterAll(async () => {
  await fakes.close();
  await closeDb();
});

describe("replay sessions", () => {
  it("a trainer builds and shares a session; a viewer plays it but cannot edit it; another organisation gets 404", async () => {
    const s = await createSession(w.as.trainer, {
      title: "Pick-up basics",
      items: [{ runId: w.runId, captions: [{ at: 1, text: "The drive starts." }, { at: 4, text: "Watch the counterweight drop here." }] }],
    });
    expect(s.items[0].captions.map((c) => c.at)).toEqual([1, 4]);
    // A draft is not there for viewers yet.
    await expectHttpError(() => getSession(w.as.viewer, s.id), 404);
    const { User } = getModels();
    const viewer = await User.findByPk(w.as.viewer.id);
    const shared = await shareSession(w.as.trainer, s.id, {});
    expect(shared.mailed).toEqual([viewer!.email.toLowerCase()]);
    const mail = (await fakes.messages()).find((m) => m.to.includes(viewer!.email.toLowerCase()) && m.subject.includes("Pick-up basics"));
    expect(mail?.text).toContain(`/replays/${s.id}`);

    const seen = await getSession(w.as.viewer, s.id);
    expect(seen.canEdit).toBe(false);
    expect(seen.items[0].captions.map((c) => c.text)).toEqual(["The drive starts.", "Watch the counterweight drop here."]);
    await expectHttpError(() => updateSession(w.as.viewer, s.id, { version: seen.version, title: "Mine now" }), 403);
    await expectHttpError(() => getSession(other.as.viewer, s.id), 404);
    await expectHttpError(() => recordView(other.as.viewer, s.id, { itemId: seen.items[0].id, watchedTo: 1 }), 404);

    await recordView(w.as.viewer, s.id, { itemId: seen.items[0].id, watchedTo: 5 });
    await recordView(w.as.viewer, s.id, { itemId: seen.items[0].id, watchedTo: 3, completed: true });
    const progress = await sessionProgress(w.as.trainer, s.id);
    expect(progress).toHaveLength(1);
    expect(progress[0].items[0]).toMatchObject({ watchedTo: 5, completed: true });
    await expectHttpError(() => sessionProgress(w.as.viewer, s.id), 403);
  });

  it("lists every problem of a bad session and stores nothing", async () => {
    const { TrainingSession } = getModels();
    const n = await TrainingSession.count({ where: { organisationId: w.organisationId } });
    const err = await expectHttpError(
      () => createSession(w.as.trainer, { title: "Bad", items: [{ runId: 999999999, captions: [] }, { runId: w.runId, captions: [{ at: 500, text: "late" }] }] }),
      400,
    );
    expect(err.issues.map((i) => i.path)).toEqual(["items.0.runId", "items.1.captions.0.at"]);
    const empty = await createSession(w.as.trainer, { title: "Empty" });
    const refused = await expectHttpError(() => shareSession(w.as.trainer, empty.id, { invite: ["nobody@elsewhere.example"] }), 400);
    expect(refused.issues.map((i) => i.path)).toEqual(["invite.0"]);
    expect(await TrainingSession.count({ where: { organisationId: w.organisationId } })).toBe(n + 1);
  });
});
