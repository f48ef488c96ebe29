import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createLift } from "@/lib/lifts/service";
import { createTrain, updateTrain } from "@/lib/trains/service";
import { createScenario, exportScenario, getScenario, updateScenario } from "@/lib/scenarios/service";
import { importScenario } from "@/lib/scenarios/import";
import type { Role } from "@/lib/auth/roles";
import type { Actor } from "@/lib/http/actor";
import { closeDb, designCounts, expectHttpError, liftBody, makeOrganisation, scenarioBody, trainBody } from "./design-fixtures";

// Scenario format 2 through the domain functions against the real test MariaDB: the scenario's drive model
// and damping, the train's start time and pawls, import and export, and bad input refused with path and unit.
let org: { organisationId: number; as: Record<Role, Actor> };
let liftId: number;
let trainId: number;

const induction = { kind: "induction", ratedPower: 200_000, ratedSlip: 0.015, breakdownRatio: 2.3, reflectedMass: 12_000 };

beforeAll(async () => {
  org = await makeOrganisation("format2");
  liftId = (await createLift(org.as.engineer, liftBody({ name: "Format 2 lift" }))).id;
  trainId = (await createTrain(org.as.engineer, trainBody({ name: "Format 2 train", pawls: [1.3, 14.3] }))).id;
});
afterAll(closeDb);

describe("a scenario's drive model and damping", () => {
  it("stores the dynamics over the pinned revision and exports them in format 2", async () => {
    const eng = org.as.engineer;
    const s = await createScenario(
      eng,
      scenarioBody(liftId, trainId, {
        name: "Format 2 dynamics",
        startTime: 0.5,
        dynamics: {
          drive: { motor: induction, location: "top", stop: { time: 20, kind: "brake", duration: 0.5 } },
          chain: { lossFactor: 0.03 },
          takeUp: { friction: 1000, damping: 2000 },
          contacts: { dogStiffness: 5e7, ardStiffness: 5e7, dampingRatio: 0.1 },
        },
      }),
    );
    expect(s.startTime).toBe(0.5);
    expect(s.dynamics?.takeUp).toEqual({ friction: 1000, damping: 2000 });
    const file = (await exportScenario(eng, s.id)).scenario;
    expect(file.format).toBe("tautline-scenario/2");
    expect(file.trains).toHaveLength(1);
    expect(file.trains[0]).toMatchObject({ startTime: 0.5, pawls: [1.3, 14.3], entrySpeed: 2.2, startPosition: 14 });
    expect(file.drive).toMatchObject({ speed: 2.5, location: "top", motor: induction, stop: { time: 20, kind: "brake", duration: 0.5 } });
    // The lift revision's own values stay where the scenario sets nothing (guide friction, chain damping default).
    expect(file.chain).toMatchObject({ lossFactor: 0.03, guideFriction: 0.02 });
    expect(file.takeUp).toMatchObject({ mass: 5000, friction: 1000, damping: 2000 });

    // A null field goes back to the revision's value; other fields stay.
    const u = await updateScenario(eng, s.id, { version: 1, dynamics: { takeUp: { friction: null } } });
    expect(u.dynamics?.takeUp).toEqual({ damping: 2000 });
    expect((await exportScenario(eng, s.id)).scenario.takeUp.friction).toBe(0);
    const cleared = await updateScenario(eng, s.id, { version: 2, dynamics: null });
    expect(cleared.dynamics).toBeNull();
  });

  it("imports its own export back to the same scenario, and reads a version 1 file with an ideal drive", async () => {
    const eng = org.as.engineer;
    const s = await createScenario(eng, scenarioBody(liftId, trainId, { name: "Format 2 round trip", dynamics: { drive: { motor: induction }, takeUp: { damping: 500 } } }));
    const file = (await exportScenario(eng, s.id)).scenario;
    const r = await importScenario(eng, { ...file, name: "Format 2 round trip (imported)" });
    expect(r.train.pawls).toEqual([1.3, 14.3]);
    expect((await exportScenario(eng, r.scenario.id)).scenario).toEqual({ ...file, name: "Format 2 round trip (imported)" });

    const { trains, ...rest } = file;
    const v1 = {
      ...rest,
      format: "tautline-scenario/1",
      name: "Format 1 file",
      drive: { speed: 2.5, rampTime: 2, sprocketTeeth: 11, efficiency: 0.9 },
      chain: { massPerLength: 15, axialStiffness: 1.5e7, breakingStrength: 5e5, pitch: 0.1016, catchSpacing: 2, catchOffset: 10, guideFriction: 0.02 },
      takeUp: { mass: 5000, travel: 2.5, position: 1.2, friction: 0 },
      train: { cars: 6, carMass: 1300, carLength: 2.6, dogOffset: 1.3, startPosition: 14, entrySpeed: 2.2 },
      contacts: undefined,
    };
    expect(trains).toHaveLength(1);
    const old = await importScenario(eng, JSON.parse(JSON.stringify(v1)));
    const out = (await exportScenario(eng, old.scenario.id)).scenario;
    expect(out.format).toBe("tautline-scenario/2");
    expect(out.drive.motor).toEqual({ kind: "ideal" });
    expect(out.trains[0]).toMatchObject({ cars: 6, carMass: 1300, startPosition: 14, entrySpeed: 2.2 });
  });
});

describe("bad input to the new fields", () => {
  // Each case: a scenario body change, the path the answer names, and the words (with the unit) it must say.
  const cases: [string, Record<string, unknown>, string, RegExp][] = [
    ["rated slip", { dynamics: { drive: { motor: { ...induction, ratedSlip: 0.5 } } } }, "dynamics.drive.motor.ratedSlip", /drive\.motor\.ratedSlip must be at most/],
    ["rated power", { dynamics: { drive: { motor: { ...induction, ratedPower: -5 } } } }, "dynamics.drive.motor.ratedPower", /drive\.motor\.ratedPower .*\(W\)/],
    ["breakdown ratio", { dynamics: { drive: { motor: { ...induction, breakdownRatio: 0.5 } } } }, "dynamics.drive.motor.breakdownRatio", /drive\.motor\.breakdownRatio must be/],
    ["reflected mass", { dynamics: { drive: { motor: { ...induction, reflectedMass: -1 } } } }, "dynamics.drive.motor.reflectedMass", /drive\.motor\.reflectedMass .*\(kg\)/],
    ["speed-loop bandwidth", { dynamics: { drive: { motor: { kind: "speed-loop", bandwidth: 0, forceLimit: 2e5, reflectedMass: 1e4 } } } }, "dynamics.drive.motor.bandwidth", /drive\.motor\.bandwidth .*\(Hz\)/],
    ["speed-loop force limit", { dynamics: { drive: { motor: { kind: "speed-loop", bandwidth: 2, forceLimit: -1, reflectedMass: 1e4 } } } }, "dynamics.drive.motor.forceLimit", /drive\.motor\.forceLimit .*\(N\)/],
    ["drive location", { dynamics: { drive: { location: "middle" } } }, "dynamics.drive.location", /drive\.location/],
    ["stop time", { dynamics: { drive: { stop: { time: -1, kind: "brake", duration: 0.5 } } } }, "dynamics.drive.stop.time", /drive\.stop\.time .*\(s\)/],
    ["stop kind", { dynamics: { drive: { stop: { time: 10, kind: "coast", duration: 0.5 } } } }, "dynamics.drive.stop.kind", /drive\.stop\.kind/],
    ["loss factor", { dynamics: { chain: { lossFactor: -0.1 } } }, "dynamics.chain.lossFactor", /chain\.lossFactor must be at least 0/],
    ["chain damping", { dynamics: { chain: { damping: -1 } } }, "dynamics.chain.damping", /chain\.damping must be at least 0 \(N·s\)/],
    ["take-up damping", { dynamics: { takeUp: { damping: -1 } } }, "dynamics.takeUp.damping", /takeUp\.damping must be at least 0 \(N·s\/m\)/],
    ["take-up friction", { dynamics: { takeUp: { friction: -1 } } }, "dynamics.takeUp.friction", /takeUp\.friction must be at least 0 \(N\)/],
    ["dog stiffness", { dynamics: { contacts: { dogStiffness: 0 } } }, "dynamics.contacts.dogStiffness", /contacts\.dogStiffness .*\(N\/m\)/],
    ["ARD stiffness", { dynamics: { contacts: { ardStiffness: -1 } } }, "dynamics.contacts.ardStiffness", /contacts\.ardStiffness .*\(N\/m\)/],
    ["contact damping", { dynamics: { contacts: { dampingRatio: -0.1 } } }, "dynamics.contacts.dampingRatio", /contacts\.dampingRatio must be at least 0/],
    ["unknown field", { dynamics: { drive: { speed: 3 } } }, "dynamics.drive", /dynamics\.drive takes only/],
    ["start time", { startTime: -1 }, "startTime", /startTime must be at least 0 \(s\)/],
  ];

  for (const [what, change, path, words] of cases) {
    it(`${what}: 400 naming ${path} with its unit, nothing stored`, async () => {
      const before = await designCounts(org.organisationId);
      const err = await expectHttpError(() => createScenario(org.as.engineer, scenarioBody(liftId, trainId, { name: `bad ${what}`, ...change })), 400);
      const issue = err.issues.find((i) => i.path === path);
      expect(issue, JSON.stringify(err.issues)).toBeDefined();
      expect(issue!.message).toMatch(words);
      expect(await designCounts(org.organisationId)).toEqual(before);
    });
  }

  it("an update with a bad field changes nothing", async () => {
    const s = await createScenario(org.as.engineer, scenarioBody(liftId, trainId, { name: "Format 2 update" }));
    const err = await expectHttpError(() => updateScenario(org.as.engineer, s.id, { version: 1, dynamics: { takeUp: { damping: -5 } } }), 400);
    expect(err.issues.map((i) => i.path)).toEqual(["dynamics.takeUp.damping"]);
    const after = await getScenario(org.as.engineer, s.id);
    expect([after.version, after.dynamics]).toEqual([1, null]);
  });

  it("a train's pawls: off the train or not numbers, 400 naming the pawl, nothing stored", async () => {
    const before = await designCounts(org.organisationId);
    const e1 = await expectHttpError(() => createTrain(org.as.engineer, trainBody({ name: "bad pawls", pawls: [1.3, 40] })), 400);
    expect(e1.issues).toEqual([{ path: "pawls.1", message: expect.stringMatching(/pawls\.1 must lie on the train .*15\.60 m/) }]);
    const e2 = await expectHttpError(() => createTrain(org.as.engineer, trainBody({ name: "bad pawls", pawls: [-1] })), 400);
    expect(e2.issues[0]!.path).toMatch(/^pawls/);
    expect(e2.issues[0]!.message).toMatch(/\(m\)/);
    await expectHttpError(() => updateTrain(org.as.engineer, trainId, { version: 1, pawls: ["front"] }), 400);
    expect(await designCounts(org.organisationId)).toEqual(before);
  });

  it("an import with a bad new field answers 400 with the engine path and unit and stores nothing", async () => {
    const eng = org.as.engineer;
    const s = await createScenario(eng, scenarioBody(liftId, trainId, { name: "Format 2 import source" }));
    const file = (await exportScenario(eng, s.id)).scenario;
    const before = await designCounts(org.organisationId);
    const bad = {
      ...file,
      drive: { ...file.drive, motor: { ...induction, ratedSlip: 0.5 } },
      chain: { ...file.chain, lossFactor: -1 },
      takeUp: { ...file.takeUp, damping: -1 },
      contacts: { ...file.contacts, dogStiffness: -1 },
      trains: [{ ...file.trains[0], startTime: -1, pawls: [-2] }],
    };
    const err = await expectHttpError(() => importScenario(eng, bad), 400);
    const paths = err.issues.map((i) => i.path);
    expect(paths).toEqual(
      expect.arrayContaining(["drive.motor.ratedSlip", "chain.lossFactor", "takeUp.damping", "contacts.dogStiffness", "trains.0.startTime"]),
    );
    expect(paths.some((p) => p.startsWith("trains.0.pawls"))).toBe(true);
    expect(err.issues.find((i) => i.path === "takeUp.damping")!.message).toMatch(/\(N·s\/m\)/);
    expect(await designCounts(org.organisationId)).toEqual(before);
  });
});
