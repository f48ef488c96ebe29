import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { parseScenario } from "@/sim/schema";
import { getModels } from "@/models";
import { createLift, updateLift } from "@/lib/lifts/service";
import { createTrain } from "@/lib/trains/service";
import {
  copyScenario,
  createScenario,
  deleteScenario,
  exportScenario,
  getScenario,
  listScenarios,
  updateScenario,
} from "@/lib/scenarios/service";
import { importScenario } from "@/lib/scenarios/import";
import { createComment, deleteComment, listComments, updateComment } from "@/lib/comments/service";
import { listAudit } from "@/lib/audit/list";
import type { Role } from "@/lib/auth/roles";
import type { Actor } from "@/lib/http/actor";
import { closeDb, designCounts, expectHttpError, liftBody, makeOrganisation, scenarioBody, trainBody } from "./design-fixtures";

let org: { organisationId: number; as: Record<Role, Actor> };
let other: { organisationId: number; as: Record<Role, Actor> };
let liftId: number;
let trainId: number;
const exampleFile = JSON.parse(fs.readFileSync(path.resolve(__dirname, "../../sim/examples/lift-hill-example.json"), "utf8"));

beforeAll(async () => {
  org = await makeOrganisation("scenarios");
  other = await makeOrganisation("scenarios-other");
  liftId = (await createLift(org.as.engineer, liftBody({ name: "Scenario lift" }))).id;
  trainId = (await createTrain(org.as.engineer, trainBody({ name: "Scenario train" }))).id;
});
afterAll(closeDb);

describe("scenario life cycle", () => {
  it("creates pinned to the lift's current revision, reads, updates with version, lists with filters, deletes", async () => {
    const eng = org.as.engineer;
    const s = await createScenario(eng, scenarioBody(liftId, trainId, { name: "Life cycle scenario" }));
    expect(s.liftRevisionNumber).toBe(1);
    expect(s.pinnedToCurrent).toBe(true);
    // Full train: 6 cars × 4 seats; car mass 1000 + 4 × 75 = 1300 kg (the example's carMass).
    expect([s.riders, s.carMass]).toEqual([24, 1300]);
    expect(s.runSettings).toMatchObject({ duration: 50, segments: 60, integrator: "verlet" });

    const u = await updateScenario(eng, s.id, { version: 1, loading: "riders", riderCount: 12, runSettings: { duration: 40 } });
    expect([u.version, u.riders, u.carMass]).toEqual([2, 12, 1150]);
    expect(u.runSettings).toMatchObject({ duration: 40, segments: 60 });

    const riders = await listScenarios(org.as.viewer, { loading: "riders", liftId: String(liftId) } as never);
    expect(riders.items.map((x) => x.id)).toContain(s.id);
    const empty = await listScenarios(org.as.viewer, { loading: "empty", liftId: String(liftId) } as never);
    expect(empty.items.map((x) => x.id)).not.toContain(s.id);

    const stale = await expectHttpError(() => updateScenario(org.as.admin, s.id, { version: 1, entrySpeed: 1 }), 409);
    expect(stale.issues[0].path).toBe("version");
    expect(await deleteScenario(eng, s.id)).toEqual({ id: s.id, outcome: "deleted" });
    await expectHttpError(() => getScenario(eng, s.id), 404);
  });

  it("lists every problem at once (own fields, references, engine rules) and stores nothing", async () => {
    const before = await designCounts(org.organisationId);
    const e1 = await expectHttpError(
      () => createScenario(org.as.engineer, scenarioBody(liftId, trainId, { loading: "riders", entrySpeed: -1, runSettings: { duration: 0 } })),
      400,
    );
    expect(e1.issues.map((i) => i.path).sort()).toEqual(["entrySpeed", "riderCount", "runSettings.duration"]);
    const e2 = await expectHttpError(
      () => createScenario(org.as.engineer, scenarioBody(999_999, 999_998, {})),
      400,
    );
    expect(e2.issues.map((i) => i.path).sort()).toEqual(["liftId", "trainId"]);
    // Past the track end (143.4 m for the example track): the engine's rule, mapped to the scenario field.
    const e3 = await expectHttpError(() => createScenario(org.as.engineer, scenarioBody(liftId, trainId, { startPosition: 200 })), 400);
    expect(e3.issues.map((i) => i.path)).toEqual(["startPosition"]);
    const e4 = await expectHttpError(() => createScenario(org.as.engineer, scenarioBody(liftId, trainId, { loading: "riders", riderCount: 25 })), 400);
    expect(e4.issues).toEqual([{ path: "riderCount", message: "riderCount must be at most the train's 24 seats" }]);
    // Another organisation's lift and train are not usable (and not revealed).
    const e5 = await expectHttpError(() => createScenario(other.as.engineer, scenarioBody(liftId, trainId)), 400);
    expect(e5.issues.map((i) => i.path).sort()).toEqual(["liftId", "trainId"]);
    expect(await designCounts(org.organisationId)).toEqual(before);
  });
});

describe("revision pinning", () => {
  it("editing the lift leaves a scenario's pinned revision and its export unchanged until re-pinned", async () => {
    const eng = org.as.engineer;
    const lift = await createLift(eng, liftBody({ name: "Pinning lift" }));
    const s = await createScenario(eng, scenarioBody(lift.id, trainId, { name: "Pinned scenario" }));
    const exported1 = (await exportScenario(eng, s.id)).scenario;
    expect(exported1.drive.speed).toBe(2.5);

    const saved = await updateLift(eng, lift.id, { version: 1, drive: { speed: 3.0 } });
    const after = await getScenario(eng, s.id);
    expect(after.liftRevisionId).toBe(s.liftRevisionId);
    expect(after.pinnedToCurrent).toBe(false);
    expect((await exportScenario(eng, s.id)).scenario).toEqual(exported1);

    const repinned = await updateScenario(eng, s.id, { version: 1, liftRevisionId: saved.currentRevision.id });
    expect([repinned.liftRevisionNumber, repinned.pinnedToCurrent]).toEqual([2, true]);
    expect((await exportScenario(eng, s.id)).scenario.drive.speed).toBe(3.0);

    // A revision of another lift cannot be pinned.
    const err = await expectHttpError(() => updateScenario(eng, s.id, { version: 2, liftId, liftRevisionId: saved.currentRevision.id }), 400);
    expect(err.issues.map((i) => i.path)).toEqual(["liftRevisionId"]);
  });

  it("a frozen scenario refuses edits and deletion with 409; a copy can be changed", async () => {
    const eng = org.as.engineer;
    const s = await createScenario(eng, scenarioBody(liftId, trainId, { name: "Frozen scenario" }));
    await getModels().Scenario.update({ frozenAt: new Date() }, { where: { id: s.id } });
    await expectHttpError(() => updateScenario(eng, s.id, { version: 1, name: "Changed" }), 409);
    await expectHttpError(() => deleteScenario(eng, s.id), 409);
    expect((await getScenario(eng, s.id)).name).toBe("Frozen scenario");
    // A copy is a new, unfrozen scenario on the same pinned revision.
    const copy = await copyScenario(eng, s.id, {});
    expect([copy.name, copy.liftRevisionId, copy.frozenAt, copy.version]).toEqual(["Frozen scenario (copy)", s.liftRevisionId, null, 1]);
    expect((await updateScenario(eng, copy.id, { version: 1, entrySpeed: 2.0 })).entrySpeed).toBe(2.0);
    await expectHttpError(() => copyScenario(org.as.viewer, s.id, {}), 403);
    await expectHttpError(() => copyScenario(other.as.engineer, s.id, {}), 404);
    await expectHttpError(() => copyScenario(eng, s.id, { name: "" }), 400);
  });
});

describe("import and export (tautline-scenario/1)", () => {
  it("imports the format's example: lift + revision 1 + train + scenario; export gives the file back", async () => {
    const eng = org.as.engineer;
    const r = await importScenario(eng, exampleFile);
    expect(r.lift.currentRevision.number).toBe(1);
    expect(r.train.carMassEmpty).toBe(1300);
    expect(r.scenario.loading).toBe("empty");
    const exported = (await exportScenario(org.as.viewer, r.scenario.id)).scenario;
    const expected = parseScenario(exampleFile);
    expect(expected.ok).toBe(true);
    if (expected.ok) expect(exported).toEqual(expected.scenario);
    const audit = await listAudit(org.as.admin, { action: "import" });
    expect(audit.items.map((a) => `${a.entity}:${a.entityId}`)).toEqual(
      expect.arrayContaining([`lift:${r.lift.id}`, `train:${r.train.id}`, `scenario:${r.scenario.id}`]),
    );
  });

  it("answers 400 listing every problem of a bad file and stores nothing", async () => {
    const before = await designCounts(org.organisationId);
    const bad = {
      ...exampleFile,
      format: "tautline-scenario/9",
      lift: { ...exampleFile.lift, angle: 120 },
      chain: { ...exampleFile.chain, massPerLength: "heavy" },
      drive: { ...exampleFile.drive, sprocketTeeth: 3 },
      train: { ...exampleFile.train, cars: 0 },
      run: { duration: -5 },
    };
    const err = await expectHttpError(() => importScenario(org.as.engineer, bad), 400);
    expect(err.issues.map((i) => i.path)).toEqual(
      expect.arrayContaining(["format", "lift.angle", "chain.massPerLength", "drive.sprocketTeeth", "train.cars", "run.duration"]),
    );
    expect(err.issues.length).toBeGreaterThanOrEqual(6);
    await expectHttpError(() => importScenario(org.as.engineer, "not an object"), 400);
    expect(await designCounts(org.organisationId)).toEqual(before);
  });

  it("import needs design:write; export is readable by every role of the organisation only", async () => {
    for (const role of ["reviewer", "operator", "trainer", "viewer"] as const) {
      await expectHttpError(() => importScenario(org.as[role], exampleFile), 403);
    }
    const s = await createScenario(org.as.engineer, scenarioBody(liftId, trainId, { name: "Export access" }));
    for (const role of ["reviewer", "operator", "trainer", "viewer"] as const) {
      expect((await exportScenario(org.as[role], s.id)).fileName).toBe("export-access.tautline.json");
    }
    await expectHttpError(() => exportScenario(other.as.admin, s.id), 404);
  });
});

describe("review comments", () => {
  it("reviewers, engineers and admins comment; others read; authors edit; author or admin removes", async () => {
    const s = await createScenario(org.as.engineer, scenarioBody(liftId, trainId, { name: "Reviewed scenario" }));
    const c = await createComment(org.as.reviewer, s.id, { body: "Pick-up delay looks long; check the chain's E·A." });
    expect(c.author?.role).toBe("reviewer");
    await createComment(org.as.engineer, s.id, { body: "Replaced with the data-sheet value." });
    for (const role of ["operator", "trainer", "viewer"] as const) {
      await expectHttpError(() => createComment(org.as[role], s.id, { body: "x" }), 403);
    }
    const list = await listComments(org.as.viewer, s.id);
    expect(list.items.map((x) => x.author?.role)).toEqual(["reviewer", "engineer"]);

    await expectHttpError(() => updateComment(org.as.engineer, s.id, c.id, { body: "not mine" }), 403);
    expect((await updateComment(org.as.reviewer, s.id, c.id, { body: "Edited." })).body).toBe("Edited.");
    await expectHttpError(() => createComment(org.as.reviewer, s.id, { body: "   " }), 400);
    await expectHttpError(() => listComments(other.as.admin, s.id), 404);
    await expectHttpError(() => createComment(other.as.reviewer, s.id, { body: "x" }), 404);

    // With comments the scenario is archived, not deleted, so the review record stays.
    expect(await deleteComment(org.as.admin, s.id, c.id)).toEqual({ id: c.id, outcome: "deleted" });
    expect(await deleteScenario(org.as.engineer, s.id)).toEqual({ id: s.id, outcome: "archived" });
    expect((await listComments(org.as.viewer, s.id)).total).toBe(1);
  });
});
