// The in-process answer cache (lib/http/read-cache.ts) and the session's user-row cache must never serve
// an answer older than the last committed write to a table it read. These checks use the real services
// and a real MariaDB; the "expected" answer is always the service's own fresh answer.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { cachedJson } from "@/lib/http/read-cache";
import { loadActiveUser } from "@/lib/auth/session";
import { createLift, listLifts, updateLift } from "@/lib/lifts/service";
import { createTrain } from "@/lib/trains/service";
import { getSequelize } from "@/lib/db/sequelize";
import { getModels } from "@/models";
import type { Role } from "@/lib/auth/roles";
import type { Actor } from "@/lib/http/actor";
import { closeDb, liftBody, makeOrganisation, trainBody } from "./design-fixtures";

let org: { organisationId: number; as: Record<Role, Actor> };

beforeAll(async () => {
  org = await makeOrganisation("cache");
});
afterAll(closeDb);

/** cachedJson with a counter of how often the answer was really computed. */
function counted(key: string, compute: () => Promise<unknown>) {
  let computed = 0;
  return {
    get computed() {
      return computed;
    },
    read: async () =>
      JSON.parse(
        await (
          await cachedJson(key, async () => {
            computed++;
            return compute();
          })
        ).text(),
      ),
  };
}

describe("answers kept until a table they read is written", () => {
  it("serves the same answer again, then the new one after a committed write to a table it read", async () => {
    const eng = org.as.engineer;
    const lift = await createLift(eng, liftBody({ name: "Cache lift A" }));
    const list = counted(`test lifts ${eng.id}`, () => listLifts(eng, { pageSize: 100 }));

    const first = await list.read();
    expect(first).toEqual(JSON.parse(JSON.stringify(await listLifts(eng, { pageSize: 100 }))));
    await list.read();
    expect(list.computed).toBe(1);

    // Another table (trains) changes: the lift list is still valid and is not recomputed.
    await createTrain(eng, trainBody({ name: "Cache train" }));
    await list.read();
    expect(list.computed).toBe(1);

    // The lift is renamed inside a transaction (updateLift): the next read computes again and shows it.
    await updateLift(eng, lift.id, { version: lift.version, name: "Cache lift A renamed" });
    const after = await list.read();
    expect(list.computed).toBe(2);
    expect(after.items.find((l: { id: number }) => l.id === lift.id).name).toBe("Cache lift A renamed");
    expect(after).toEqual(JSON.parse(JSON.stringify(await listLifts(eng, { pageSize: 100 }))));
  });

  it("does not keep an answer when a table it read was written while it was being computed", async () => {
    const eng = org.as.engineer;
    const lift = await createLift(eng, liftBody({ name: "Cache lift B" }));
    let release!: () => void;
    const gate = new Promise<void>((r) => (release = r));
    let computed = 0;
    let hasRead!: () => void;
    const read = new Promise<void>((r) => (hasRead = r));
    const compute = async () => {
      const first = ++computed === 1;
      const page = await listLifts(eng, { pageSize: 100 });
      if (first) {
        hasRead();
        await gate; // the write below lands between this read and the answer
      }
      return page;
    };
    const slow = cachedJson(`test lifts mid-write ${eng.id}`, compute);
    await read;
    await updateLift(eng, lift.id, { version: lift.version, name: "Cache lift B renamed" });
    release();
    const stale = JSON.parse(await (await slow).text());
    expect(stale.items.find((l: { id: number }) => l.id === lift.id).name).toBe("Cache lift B");
    const next = JSON.parse(await (await cachedJson(`test lifts mid-write ${eng.id}`, compute)).text());
    expect(computed).toBe(2);
    expect(next.items.find((l: { id: number }) => l.id === lift.id).name).toBe("Cache lift B renamed");
  });

  it("computes once for requests that arrive together, and not across keys", async () => {
    const eng = org.as.engineer;
    const viewer = org.as.viewer;
    const a = counted(`test together ${eng.id}`, () => listLifts(eng, {}));
    const answers = await Promise.all(Array.from({ length: 10 }, () => a.read()));
    expect(a.computed).toBe(1);
    expect(new Set(answers.map((x) => JSON.stringify(x))).size).toBe(1);
    const b = counted(`test together ${viewer.id}`, () => listLifts(viewer, {}));
    await b.read();
    expect(b.computed).toBe(1);
  });

  it("lets a request share a computation in flight only while nothing that computation reads has been written", async () => {
    const eng = org.as.engineer;
    const lift = await createLift(eng, liftBody({ name: "Cache lift C" }));
    const key = `test join ${eng.id}`;
    let computed = 0;
    let gate: Promise<void> | null = null;
    let hasRead: () => void = () => undefined;
    const compute = async () => {
      computed++;
      const held = gate;
      const page = await listLifts(eng, { pageSize: 100 });
      hasRead();
      if (held) await held;
      return page;
    };
    const readDone = () => new Promise<void>((r) => (hasRead = r));
    const nameIn = async (r: Promise<Response>) =>
      (JSON.parse(await (await r).text()) as { items: { id: number; name: string }[] }).items.find((l) => l.id === lift.id)!.name;
    await cachedJson(key, compute); // the key's answer is known to read lifts and lift_revisions
    let v = (await updateLift(eng, lift.id, { version: lift.version, name: "Cache lift C 2" })).version;

    // A write to another table while a computation is in flight: the next request shares it.
    let release!: () => void;
    gate = new Promise<void>((r) => (release = r));
    let read = readDone();
    const first = cachedJson(key, compute);
    await read;
    await createTrain(eng, trainBody({ name: "Cache train C" }));
    const shared = cachedJson(key, compute);
    release();
    expect(await nameIn(first)).toBe("Cache lift C 2");
    expect(await nameIn(shared)).toBe("Cache lift C 2");
    expect(computed).toBe(2);

    // A write to a table it reads while it is in flight: the next request computes its own, fresh answer.
    v = (await updateLift(eng, lift.id, { version: v, name: "Cache lift C 3" })).version;
    gate = new Promise<void>((r) => (release = r));
    read = readDone();
    const slow = cachedJson(key, compute);
    await read;
    await updateLift(eng, lift.id, { version: v, name: "Cache lift C 4" });
    gate = null;
    const own = cachedJson(key, compute);
    expect(await nameIn(own)).toBe("Cache lift C 4");
    release();
    expect(await nameIn(slow)).toBe("Cache lift C 3");
    expect(computed).toBe(4);
  });

  it("never keeps an error", async () => {
    let calls = 0;
    const failing = () =>
      cachedJson("test failing", async () => {
        calls++;
        throw new Error("refused");
      });
    await expect(failing()).rejects.toThrow("refused");
    await expect(failing()).rejects.toThrow("refused");
    expect(calls).toBe(2);
  });
});

describe("the session's user row", () => {
  it("is read again after the row changes, also when the change commits after a read inside its transaction", async () => {
    const { User } = getModels();
    const target = await User.create({
      organisationId: org.organisationId,
      email: `cache-target-${Date.now()}@design-test.example`,
      name: "Cache target",
      role: "operator",
      passwordHash: "x",
    });
    expect((await loadActiveUser(target.id, target.sessionVersion))?.role).toBe("operator");

    await getSequelize().transaction(async (transaction) => {
      await User.update({ active: false }, { where: { id: target.id }, transaction });
      // Before the commit this connection-less read still sees the active row, and may keep it...
      expect(await loadActiveUser(target.id, target.sessionVersion)).not.toBeNull();
    });
    // ...but the commit makes it stale: the very next request is refused.
    expect(await loadActiveUser(target.id, target.sessionVersion)).toBeNull();

    await User.update({ active: true, role: "reviewer" }, { where: { id: target.id } });
    expect((await loadActiveUser(target.id, target.sessionVersion))?.role).toBe("reviewer");
    // A session version that moved on (sign-out, password change) is refused at once.
    await User.update({ sessionVersion: target.sessionVersion + 1 }, { where: { id: target.id } });
    expect(await loadActiveUser(target.id, target.sessionVersion)).toBeNull();
  });
});
