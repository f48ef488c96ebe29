import { describe, expect, it } from "vitest";
import example from "@/sim/examples/lift-hill-example.json";
import exampleV2 from "@/sim/examples/lift-hill-example-v2.json";
import { isV1, parseScenario, pawlsOf, SCENARIO_FORMAT, upgradeScenario, scenarioV1Schema } from "@/sim/schema";

const clone = <T>(x: T): T => JSON.parse(JSON.stringify(x)) as T;

describe("scenario format 2", () => {
  it("reads the version 2 example with every new field", () => {
    const r = parseScenario(exampleV2);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.scenario.format).toBe(SCENARIO_FORMAT);
    expect(r.scenario.drive.motor).toEqual({ kind: "induction", ratedPower: 160000, ratedSlip: 0.015, breakdownRatio: 2.3, reflectedMass: 12000 });
    expect(r.scenario.trains).toHaveLength(1);
    expect(pawlsOf(r.scenario.trains[0])).toEqual([1.3]);
  });

  it("fills the documented defaults of the new fields", () => {
    const doc = clone(exampleV2) as unknown as Record<string, Record<string, unknown>>;
    delete doc.drive.motor;
    delete doc.drive.location;
    delete doc.chain.lossFactor;
    delete doc.takeUp.damping;
    delete (doc as Record<string, unknown>).contacts;
    const t = (doc.trains as unknown as Record<string, unknown>[])[0];
    delete t.startTime;
    delete t.pawls;
    const r = parseScenario(doc);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const s = r.scenario;
    expect(s.drive.location).toBe("bottom");
    expect(s.drive.motor.kind).toBe("induction");
    expect(s.chain.lossFactor).toBe(0.02);
    expect(s.takeUp.damping).toBe(0);
    expect(s.contacts).toEqual({ dogStiffness: 5e7, ardStiffness: 5e7, dampingRatio: 0.1 });
    expect(s.trains[0].startTime).toBe(0);
    expect(pawlsOf(s.trains[0])).toEqual([s.trains[0].dogOffset]); // one pawl at the dog
  });

  it("converts version 1: train → trains[0], an ideal drive, no loss factor, the contact version 1 used", () => {
    expect(isV1(example)).toBe(true);
    const r = parseScenario(example);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const s = r.scenario;
    expect(s.format).toBe(SCENARIO_FORMAT);
    expect(s.drive.motor).toEqual({ kind: "ideal" });
    expect(s.drive.location).toBe("bottom");
    expect(s.chain.lossFactor).toBe(0);
    expect(s.takeUp.damping).toBe(0);
    expect(s.trains[0]).toMatchObject({ ...example.train, startTime: 0, pawls: [example.train.dogOffset] });
    // 60 segments: 30 per strand of 112 m, 3.73 m each: E·A / max(1 m, 0.93 m) = E·A / 1 m (version 1's default).
    expect(s.contacts.dogStiffness).toBeCloseTo(example.chain.axialStiffness, 6);
    expect(s.contacts.dampingRatio).toBe(0.1);
    // The conversion is pure and its result is a valid version 2 document.
    const v1 = scenarioV1Schema.parse(example);
    expect(upgradeScenario(v1)).toEqual(s);
    expect(parseScenario(clone(s))).toEqual({ ok: true, scenario: s });
  });

  it("rejects each new field with its path and unit", () => {
    const doc = clone(exampleV2) as unknown as Record<string, Record<string, unknown>>;
    doc.drive.motor = { kind: "induction", ratedSlip: 0.5, breakdownRatio: 1, reflectedMass: -1 };
    doc.drive.location = "middle";
    doc.drive.stop = { time: 10, kind: "coast", duration: -1 };
    doc.chain.lossFactor = 2;
    doc.takeUp.damping = -5;
    (doc as Record<string, unknown>).contacts = { dogStiffness: 0, dampingRatio: 3 };
    const t = (doc.trains as unknown as Record<string, unknown>[])[0];
    t.startTime = -1;
    t.pawls = [1.3, 400];
    const r = parseScenario(doc);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const byPath = Object.fromEntries(r.issues.map((i) => [i.path, i.message]));
    expect(byPath["drive.motor.ratedSlip"]).toBe("drive.motor.ratedSlip must be at most 0.2");
    expect(byPath["drive.motor.breakdownRatio"]).toContain("at least 1.05");
    expect(byPath["drive.motor.reflectedMass"]).toBe("drive.motor.reflectedMass must be at least 0 (kg)");
    expect(byPath["drive.location"]).toContain("bottom, top");
    expect(byPath["drive.stop.kind"]).toContain("brake, power-loss");
    expect(byPath["drive.stop.duration"]).toBe("drive.stop.duration must be at least 0 (s)");
    expect(byPath["chain.lossFactor"]).toBe("chain.lossFactor must be at most 0.5");
    expect(byPath["takeUp.damping"]).toBe("takeUp.damping must be at least 0 (N·s/m)");
    expect(byPath["contacts.dogStiffness"]).toBe("contacts.dogStiffness must be at least 10000 (N/m)");
    expect(byPath["contacts.dampingRatio"]).toBe("contacts.dampingRatio must be at most 2");
    expect(byPath["trains.0.startTime"]).toBe("trains.0.startTime must be at least 0 (s)");
    expect(byPath["trains.0.pawls.1"]).toContain("trains.0.pawls.1 must not exceed the train length 15.60 m");
  });

  it("names the index of the train at fault and refuses a restart before the stop", () => {
    const doc = clone(exampleV2) as unknown as Record<string, Record<string, unknown>>;
    const trains = doc.trains as unknown as Record<string, unknown>[];
    trains.push({ ...trains[0], carMass: 5, startTime: 30 });
    doc.drive.stop = { time: 20 };
    doc.drive.restart = { time: 15 };
    const r = parseScenario(doc);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues).toContainEqual({ path: "trains.1.carMass", message: "trains.1.carMass must be at least 10 (kg)" });
    expect(r.issues).toContainEqual({ path: "drive.restart.time", message: "drive.restart.time must be later than drive.stop.time (s)" });
  });
});
