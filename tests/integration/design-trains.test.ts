import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createTrain, deleteTrain, getTrain, listTrains, updateTrain } from "@/lib/trains/service";
import { createLift } from "@/lib/lifts/service";
import { createScenario } from "@/lib/scenarios/service";
import type { Role } from "@/lib/auth/roles";
import type { Actor } from "@/lib/http/actor";
import { closeDb, designCounts, expectHttpError, liftBody, makeOrganisation, scenarioBody, trainBody } from "./design-fixtures";

let org: { organisationId: number; as: Record<Role, Actor> };
let other: { organisationId: number; as: Record<Role, Actor> };

beforeAll(async () => {
  org = await makeOrganisation("trains");
  other = await makeOrganisation("trains-other");
});
afterAll(closeDb);

describe("trains", () => {
  it("life cycle: create with the default rider mass, update with version, list, delete", async () => {
    const eng = org.as.engineer;
    const { riderMass: _ignored, ...withoutRiderMass } = trainBody({ name: "Life cycle train" });
    void _ignored;
    const t = await createTrain(eng, withoutRiderMass);
    expect(t.riderMass).toBe(75); // assumption (lib/trains/schema.ts DEFAULT_RIDER_MASS)
    // Loaded car mass = empty + seats × rider mass = 1000 + 4 × 75.
    expect(t.carMassLoaded).toBe(1300);
    const u = await updateTrain(eng, t.id, { version: 1, seatsPerCar: 2 });
    expect([u.version, u.seatsPerCar, u.carMassLoaded, u.cars]).toEqual([2, 2, 1150, 6]);
    expect((await listTrains(org.as.viewer, { q: "Life cycle train" })).items.map((x) => x.id)).toEqual([t.id]);
    expect(await deleteTrain(eng, t.id)).toEqual({ id: t.id, outcome: "deleted" });
    await expectHttpError(() => getTrain(eng, t.id), 404);
  });

  it("refuses bad input with every field path, a stale version with 409, and stores nothing", async () => {
    const eng = org.as.engineer;
    const before = await designCounts(org.organisationId);
    const err = await expectHttpError(() => createTrain(eng, trainBody({ cars: 0, carLength: "long", dragArea: -1 })), 400);
    expect(err.issues.map((i) => i.path).sort()).toEqual(["carLength", "cars", "dragArea"]);
    const dog = await expectHttpError(() => createTrain(eng, trainBody({ cars: 1, carLength: 2, dogOffset: 3 })), 400);
    expect(dog.issues.map((i) => i.path)).toEqual(["dogOffset"]);
    expect(await designCounts(org.organisationId)).toEqual(before);

    const t = await createTrain(eng, trainBody());
    await updateTrain(eng, t.id, { version: 1, cars: 5 });
    const mid = await designCounts(org.organisationId);
    const stale = await expectHttpError(() => updateTrain(org.as.admin, t.id, { version: 1, cars: 7 }), 409);
    expect(stale.issues[0]).toEqual({ path: "version", message: "stale: the current version is 2" });
    expect(await designCounts(org.organisationId)).toEqual(mid);
    expect((await getTrain(eng, t.id)).cars).toBe(5);
  });

  it("archives a train a scenario uses, and restores it on request", async () => {
    const eng = org.as.engineer;
    const t = await createTrain(eng, trainBody({ name: "Used train" }));
    const lift = await createLift(eng, liftBody());
    await createScenario(eng, scenarioBody(lift.id, t.id));
    expect(await deleteTrain(eng, t.id)).toEqual({ id: t.id, outcome: "archived" });
    const archived = await getTrain(eng, t.id);
    expect(archived.archivedAt).not.toBeNull();
    await expectHttpError(() => updateTrain(eng, t.id, { version: archived.version, cars: 5 }), 409);
    const restored = await updateTrain(eng, t.id, { version: archived.version, archived: false });
    expect(restored.archivedAt).toBeNull();
    expect((await updateTrain(eng, t.id, { version: restored.version, cars: 5 })).cars).toBe(5);
    await expectHttpError(() => updateTrain(org.as.viewer, t.id, { version: 1, archived: false }), 403);
  });

  it("another organisation's train is 404; only engineers/admins write", async () => {
    const t = await createTrain(org.as.engineer, trainBody({ name: "Private train" }));
    for (const actor of Object.values(other.as)) await expectHttpError(() => getTrain(actor, t.id), 404);
    await expectHttpError(() => updateTrain(other.as.admin, t.id, { version: 1, cars: 2 }), 404);
    await expectHttpError(() => deleteTrain(other.as.engineer, t.id), 404);
    for (const role of ["reviewer", "operator", "trainer", "viewer"] as const) {
      await expectHttpError(() => createTrain(org.as[role], trainBody()), 403);
      await expectHttpError(() => updateTrain(org.as[role], t.id, { version: 1, cars: 2 }), 403);
    }
  });
});
