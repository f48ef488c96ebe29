import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createEntry } from "@/lib/logbook/service";
import { idempotencyKeyOf } from "@/lib/http/idempotency";
import { HttpError } from "@/lib/http/errors";
import { getModels } from "@/models";
import { closeDb, expectHttpError } from "./design-fixtures";
import { opsFakes, opsWorld } from "./logbook-fixtures";

let fakes: Awaited<ReturnType<typeof opsFakes>>;
let w: Awaited<ReturnType<typeof opsWorld>>;

beforeAll(async () => {
  fakes = await opsFakes();
  w = await opsWorld("idem");
});
afterAll(async () => {
  await fakes.close();
  await closeDb();
});

const entries = () => getModels().LogbookEntry.count({ where: { liftId: w.liftId } });

describe("logbook writes with an Idempotency-Key", () => {
  it("a retry of a committed write is answered from the committed row, not written again", async () => {
    const before = await entries();
    const body = { kind: "take-up", liftId: w.liftId, position: 1.1, measuredAt: "2026-03-01T08:00:00Z" };
    const first = await createEntry(w.as.operator, body, { idempotencyKey: "4b1d0c1e-retry-1" });
    // The client never saw that answer (say the connection dropped just after the commit) and sends it again.
    const retry = await createEntry(w.as.operator, body, { idempotencyKey: "4b1d0c1e-retry-1" });
    expect(retry.replayed).toBe(true);
    expect(retry.entry).toEqual(first.entry);
    expect(await entries()).toBe(before + 1);
  });

  it("the same key sent twice at once still writes one row", async () => {
    const before = await entries();
    const body = { kind: "lubrication", liftId: w.liftId, lubricant: "Chain oil" };
    const [a, b] = await Promise.all([
      createEntry(w.as.operator, body, { idempotencyKey: "parallel-7" }),
      createEntry(w.as.operator, body, { idempotencyKey: "parallel-7" }),
    ]);
    expect(a.entry.id).toBe(b.entry.id);
    expect(await entries()).toBe(before + 1);
  });

  it("a key reused for a different entry answers 409; without a key every write is new", async () => {
    await createEntry(w.as.operator, { kind: "take-up", liftId: w.liftId, position: 1.2 }, { idempotencyKey: "reuse-1" });
    await expectHttpError(() => createEntry(w.as.operator, { kind: "lubrication", liftId: w.liftId }, { idempotencyKey: "reuse-1" }), 409);
    const before = await entries();
    await createEntry(w.as.operator, { kind: "take-up", liftId: w.liftId, position: 1.2 });
    await createEntry(w.as.operator, { kind: "take-up", liftId: w.liftId, position: 1.2 });
    expect(await entries()).toBe(before + 2);
  });

  it("reads the header, refusing keys that are not plain tokens", () => {
    const req = (v?: string) => new Request("http://localhost/api/logbook/entries", { method: "POST", headers: v === undefined ? {} : { "Idempotency-Key": v } });
    expect(idempotencyKeyOf(req())).toBeUndefined();
    expect(idempotencyKeyOf(req(" 9f0e-11 "))).toBe("9f0e-11");
    expect(() => idempotencyKeyOf(req("a b"))).toThrow(HttpError);
    expect(() => idempotencyKeyOf(req("x".repeat(101)))).toThrow(HttpError);
  });
});
