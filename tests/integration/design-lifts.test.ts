import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createLift, deleteLift, getLift, getRevision, listLifts, listRevisions, updateLift } from "@/lib/lifts/service";
import { createChainSpec, updateChainSpec } from "@/lib/chains/service";
import { createTrain } from "@/lib/trains/service";
import { createScenario } from "@/lib/scenarios/service";
import { listAudit } from "@/lib/audit/list";
import type { Role } from "@/lib/auth/roles";
import type { Actor } from "@/lib/http/actor";
import { closeDb, designCounts, expectHttpError, liftBody, makeOrganisation, scenarioBody, trainBody } from "./design-fixtures";

let org: { organisationId: number; as: Record<Role, Actor> };
let other: { organisationId: number; as: Record<Role, Actor> };

beforeAll(async () => {
  org = await makeOrganisation("lifts");
  other = await makeOrganisation("lifts-other");
});
afterAll(closeDb);

describe("lift life cycle", () => {
  it("creates revision 1, saves revision 2 with a diff, lists, reads revisions and deletes an unused lift", async () => {
    const eng = org.as.engineer;
    const created = await createLift(eng, liftBody({ name: "Life cycle lift" }));
    expect(created.version).toBe(1);
    expect(created.currentRevision.number).toBe(1);
    // Defaults of the scenario format are filled in and stored (sim/schema.ts: chain.damping 2000, limits).
    expect(created.currentRevision.chain.damping).toBe(2000);
    expect(created.currentRevision.limits.requiredSafetyFactor).toBe(5);
    expect(created.currentRevision.chainSpecId).toBeNull();

    const saved = await updateLift(eng, created.id, { version: 1, lift: { angle: 38 }, changeSummary: "Flatter incline" });
    expect(saved.version).toBe(2);
    expect(saved.currentRevision.number).toBe(2);
    expect(saved.currentRevision.lift.angle).toBe(38);
    expect(saved.currentRevision.lift.inclineLength).toBe(50); // merged field by field
    expect(saved.changes).toEqual([{ path: "lift.angle", before: 40, after: 38 }]);

    const revs = await listRevisions(eng, created.id);
    expect(revs.total).toBe(2);
    expect(revs.items.map((r) => [r.number, r.current])).toEqual([[2, true], [1, false]]);
    const r2 = await getRevision(eng, created.id, 2);
    expect(r2.comparedWith).toBe(1);
    expect(r2.changes).toEqual([{ path: "lift.angle", before: 40, after: 38 }]);
    const r1 = await getRevision(eng, created.id, 1, { compare: 2 });
    expect(r1.revision.lift.angle).toBe(40); // the old revision is unchanged
    expect(r1.changes).toEqual([{ path: "lift.angle", before: 38, after: 40 }]);

    const list = await listLifts(org.as.viewer, { q: "Life cycle" });
    expect(list.items.map((l) => [l.name, l.currentRevisionNumber])).toEqual([["Life cycle lift", 2]]);

    expect(await deleteLift(eng, created.id)).toEqual({ id: created.id, outcome: "deleted" });
    await expectHttpError(() => getLift(eng, created.id), 404);
    const audit = await listAudit(org.as.reviewer, { entity: "lift", entityId: String(created.id), sort: "at", order: "asc" });
    expect(audit.items.map((a) => a.action)).toEqual(["create", "update", "delete"]);
    expect(audit.items[1].changes.some((c) => c.path === "currentRevision.lift.angle")).toBe(true);
  });

  it("takes a lift without site and notes (optional fields)", async () => {
    const { site: _s, notes: _n, ...body } = liftBody({ name: "Minimal lift" });
    void _s;
    void _n;
    const lift = await createLift(org.as.engineer, body);
    expect([lift.site, lift.notes, lift.currentRevision.site]).toEqual([null, null, null]);
  });

  it("a save that changes nothing writes no revision", async () => {
    const eng = org.as.engineer;
    const lift = await createLift(eng, liftBody({ name: "No-op lift" }));
    const before = await designCounts(org.organisationId);
    const same = await updateLift(eng, lift.id, { version: 1, lift: { angle: 40 } });
    expect(same.version).toBe(1);
    expect(same.changes).toEqual([]);
    expect(await designCounts(org.organisationId)).toEqual(before);
  });

  it("lists with paging and sorting, and refuses an unknown sort field naming sort", async () => {
    const eng = org.as.engineer;
    for (const n of ["Paging C", "Paging A", "Paging B"]) await createLift(eng, liftBody({ name: n }));
    const p1 = await listLifts(eng, { q: "Paging", sort: "name", order: "desc", pageSize: "2", page: "1" } as never);
    expect(p1.total).toBe(3);
    expect(p1.items.map((l) => l.name)).toEqual(["Paging C", "Paging B"]);
    const p2 = await listLifts(eng, { q: "Paging", sort: "name", order: "desc", pageSize: "2", page: "2" } as never);
    expect(p2.items.map((l) => l.name)).toEqual(["Paging A"]);
    const err = await expectHttpError(() => listLifts(eng, { sort: "password" } as never), 400);
    expect(err.issues.map((i) => i.path)).toEqual(["sort"]);
    const big = await expectHttpError(() => listLifts(eng, { pageSize: "500" } as never), 400);
    expect(big.issues.map((i) => i.path)).toEqual(["pageSize"]);
  });
});

describe("lift validation", () => {
  it("lists every problem at once with field paths and stores nothing", async () => {
    const before = await designCounts(org.organisationId);
    const err = await expectHttpError(
      () =>
        createLift(
          org.as.engineer,
          liftBody({
            name: "",
            lift: { ...liftBody().lift, chainTo: 4000, sagRadius: 0 },
            drive: { speed: -1, sprocketTeeth: 11 },
            takeUp: { mass: 5000, travel: 1, position: 2 },
          }),
        ),
      400,
    );
    const paths = err.issues.map((i) => i.path);
    expect(paths).toEqual(expect.arrayContaining(["name", "lift.sagRadius", "drive.speed", "takeUp.position"]));
    expect(await designCounts(org.organisationId)).toEqual(before);
  });

  it("reports a rule between fields (chain beyond the track end) together with a field error", async () => {
    const before = await designCounts(org.organisationId);
    // Track length of the example: 15 + 30·0.698 + 50 + 25·0.698 + 40 = 143.4 m (sim/schema.ts trackLength).
    const err = await expectHttpError(
      () => createLift(org.as.engineer, liftBody({ lift: { ...liftBody().lift, chainTo: 150 }, drive: { speed: 0, sprocketTeeth: 11 } })),
      400,
    );
    expect(err.issues.map((i) => i.path).sort()).toEqual(["drive.speed", "lift.chainTo"]);
    expect(await designCounts(org.organisationId)).toEqual(before);
  });

  it("refuses an update with bad fields and writes nothing (no revision, same version)", async () => {
    const lift = await createLift(org.as.engineer, liftBody({ name: "Bad update lift" }));
    const before = await designCounts(org.organisationId);
    const err = await expectHttpError(() => updateLift(org.as.engineer, lift.id, { version: 1, drive: { sprocketTeeth: 2.5 } }), 400);
    expect(err.issues.map((i) => i.path)).toEqual(["drive.sprocketTeeth"]);
    expect(await designCounts(org.organisationId)).toEqual(before);
    expect((await getLift(org.as.engineer, lift.id)).version).toBe(1);
  });

  it("answers 409 with the current version on a stale update and loses nothing", async () => {
    const eng = org.as.engineer;
    const lift = await createLift(eng, liftBody({ name: "Stale lift" }));
    await updateLift(eng, lift.id, { version: 1, drive: { speed: 2.0 } });
    const before = await designCounts(org.organisationId);
    const err = await expectHttpError(() => updateLift(org.as.admin, lift.id, { version: 1, drive: { speed: 3.0 } }), 409);
    expect(err.issues).toEqual([{ path: "version", message: "stale: the current version is 2" }]);
    expect(err.headers["X-Current-Version"]).toBe("2");
    expect(await designCounts(org.organisationId)).toEqual(before);
    expect((await getLift(eng, lift.id)).currentRevision.drive.speed).toBe(2.0);
  });

  it("two saves of the same version at once: exactly one wins, the other gets 409, one revision is written", async () => {
    const lift = await createLift(org.as.engineer, liftBody({ name: "Race lift" }));
    const results = await Promise.allSettled([
      updateLift(org.as.engineer, lift.id, { version: 1, drive: { speed: 2.1 } }),
      updateLift(org.as.admin, lift.id, { version: 1, drive: { speed: 2.9 } }),
    ]);
    const ok = results.filter((r) => r.status === "fulfilled");
    const refused = results.filter((r) => r.status === "rejected") as PromiseRejectedResult[];
    expect(ok).toHaveLength(1);
    expect(refused.map((r) => (r.reason as { status?: number }).status)).toEqual([409]);
    const revs = await listRevisions(org.as.viewer, lift.id);
    expect(revs.items.map((r) => r.number)).toEqual([2, 1]);
    const winner = (ok[0] as PromiseFulfilledResult<Awaited<ReturnType<typeof updateLift>>>).value;
    expect((await getLift(org.as.viewer, lift.id)).currentRevision.drive.speed).toBe(winner.currentRevision.drive.speed);
  });

  it("rejects unknown top-level fields and a missing version", async () => {
    const e1 = await expectHttpError(() => createLift(org.as.engineer, { ...liftBody(), colour: "red" }), 400);
    expect(e1.issues.map((i) => i.path)).toContain("(body)");
    const lift = await createLift(org.as.engineer, liftBody({ name: "Versionless" }));
    const e2 = await expectHttpError(() => updateLift(org.as.engineer, lift.id, { drive: { speed: 2 } }), 400);
    expect(e2.issues.map((i) => i.path)).toEqual(["version"]);
  });
});

describe("chain values are copied from the catalogue", () => {
  it("copies a catalogue chain into the revision; a later catalogue edit leaves the revision as it was", async () => {
    const eng = org.as.engineer;
    const spec = await createChainSpec(eng, {
      designation: "Test heavy lift chain",
      pitch: 0.1016,
      massPerLength: 14,
      axialStiffness: 1.4e7,
      breakingStrength: 4.8e5,
      source: "Invented data sheet for a test",
    });
    const lift = await createLift(eng, liftBody({ name: "Catalogue lift", chain: { chainSpecId: spec.id, catchSpacing: 2, catchOffset: 10 } }));
    const rev = lift.currentRevision;
    expect(rev.chainSpecId).toBe(spec.id);
    expect(rev.chain).toMatchObject({ pitch: 0.1016, massPerLength: 14, axialStiffness: 1.4e7, breakingStrength: 4.8e5, catchSpacing: 2 });

    await updateChainSpec(eng, spec.id, { version: 1, massPerLength: 16 });
    expect((await getLift(eng, lift.id)).currentRevision.chain.massPerLength).toBe(14);

    // Editing the routing keeps the copied values; choosing the chain again copies the new ones.
    const routed = await updateLift(eng, lift.id, { version: 1, chain: { guideFriction: 0.03 } });
    expect(routed.currentRevision.chain).toMatchObject({ massPerLength: 14, guideFriction: 0.03 });
    expect(routed.currentRevision.chainSpecId).toBe(spec.id);
    const recopied = await updateLift(eng, lift.id, { version: 2, chain: { chainSpecId: spec.id } });
    expect(recopied.currentRevision.chain.massPerLength).toBe(16);
  });

  it("refuses a chain id of another organisation, and both an id and values at once", async () => {
    const foreign = await createChainSpec(other.as.engineer, {
      designation: "Other org chain",
      pitch: 0.1016,
      massPerLength: 14,
      axialStiffness: 1.4e7,
      breakingStrength: 4.8e5,
      source: "Invented",
    });
    const before = await designCounts(org.organisationId);
    const e1 = await expectHttpError(
      () => createLift(org.as.engineer, liftBody({ chain: { chainSpecId: foreign.id, catchSpacing: 2 } })),
      400,
    );
    expect(e1.issues.map((i) => i.path)).toEqual(["chain.chainSpecId"]);
    const e2 = await expectHttpError(
      () => createLift(org.as.engineer, liftBody({ chain: { ...liftBody().chain, chainSpecId: foreign.id } })),
      400,
    );
    expect(e2.issues.map((i) => i.path)).toContain("chain.chainSpecId");
    expect(await designCounts(org.organisationId)).toEqual(before);
  });
});

describe("archiving and access", () => {
  it("archives a lift that a scenario uses instead of deleting it; archived lifts refuse edits", async () => {
    const eng = org.as.engineer;
    const lift = await createLift(eng, liftBody({ name: "Used lift" }));
    const train = await createTrain(eng, trainBody());
    await createScenario(eng, scenarioBody(lift.id, train.id));
    expect(await deleteLift(eng, lift.id)).toEqual({ id: lift.id, outcome: "archived" });
    const archived = await getLift(eng, lift.id);
    expect(archived.archivedAt).not.toBeNull();
    expect((await listLifts(eng, { q: "Used lift" })).total).toBe(0);
    expect((await listLifts(eng, { q: "Used lift", archived: "true" })).total).toBe(1);
    await expectHttpError(() => updateLift(eng, lift.id, { version: archived.version, name: "Renamed" }), 409);

    // Restoring is the one edit an archived lift takes; it writes no revision.
    await expectHttpError(() => updateLift(eng, lift.id, { version: archived.version - 1, archived: false }), 409);
    const restored = await updateLift(eng, lift.id, { version: archived.version, archived: false });
    expect([restored.archivedAt, restored.version, restored.currentRevision.number]).toEqual([null, archived.version + 1, 1]);
    expect((await listLifts(eng, { q: "Used lift" })).total).toBe(1);
    expect((await updateLift(eng, lift.id, { version: restored.version, name: "Used lift, renamed" })).currentRevision.number).toBe(2);
  });

  it("another organisation's lift is not found (404) for every role, never 403", async () => {
    const lift = await createLift(org.as.engineer, liftBody({ name: "Private lift" }));
    for (const actor of Object.values(other.as)) {
      await expectHttpError(() => getLift(actor, lift.id), 404);
      await expectHttpError(() => listRevisions(actor, lift.id), 404);
    }
    await expectHttpError(() => updateLift(other.as.engineer, lift.id, { version: 1, name: "Taken" }), 404);
    await expectHttpError(() => deleteLift(other.as.admin, lift.id), 404);
    expect((await listLifts(other.as.admin, { q: "Private lift" })).total).toBe(0);
  });

  it("only engineers and admins write lifts; every role reads", async () => {
    const lift = await createLift(org.as.admin, liftBody({ name: "Role lift" }));
    for (const role of ["reviewer", "operator", "trainer", "viewer"] as const) {
      await expectHttpError(() => createLift(org.as[role], liftBody()), 403);
      await expectHttpError(() => updateLift(org.as[role], lift.id, { version: 1, name: "x" }), 403);
      await expectHttpError(() => deleteLift(org.as[role], lift.id), 403);
      expect((await getLift(org.as[role], lift.id)).id).toBe(lift.id);
    }
  });
});
