import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getModels } from "@/models";
import { createLift } from "@/lib/lifts/service";
import { createTrain } from "@/lib/trains/service";
import { copyScenario, createScenario, exportScenario, getScenario, updateScenario } from "@/lib/scenarios/service";
import { importScenario } from "@/lib/scenarios/import";
import { createEntry } from "@/lib/logbook/service";
import { runWithTodaysChain } from "@/lib/logbook/chain-run";
import { json } from "@/lib/runs/serialize";
import { takeSnapshot } from "@/lib/reports/snapshot";
import type { Report } from "@/models/Report";
import type { ReportContent } from "@/lib/reports/content";
import type { Role } from "@/lib/auth/roles";
import type { Actor } from "@/lib/http/actor";
import { closeDb, designCounts, expectHttpError, liftBody, makeOrganisation, scenarioBody, trainBody } from "./design-fixtures";
import { opsFakes } from "./logbook-fixtures";
import { finished } from "./runs-fixtures";

// Lift operations through the domain functions against the real test MariaDB: several trains in a stored
// scenario (save, refuse, copy, export, import), a restart before the stop refused, and the logbook's run
// with today's chain. Bad input answers 400 naming the field path and unit, and stores nothing.
let org: { organisationId: number; as: Record<Role, Actor> };
let other: { organisationId: number; as: Record<Role, Actor> };
let liftId: number;
let leadId: number;
let secondId: number;
let fakes: Awaited<ReturnType<typeof opsFakes>>;

// The test lift (design-fixtures: the format's example lift hill): chain from 10 m, a 6-car train of 2.6 m cars
// = 15.6 m long. A follower 12 s behind the lead at the same start position is well clear of it.
const follower = (o: Record<string, unknown> = {}) => ({ trainId: secondId, loading: "empty", entrySpeed: 2.2, startPosition: 14, startTime: 12, ...o });

beforeAll(async () => {
  fakes = await opsFakes();
  org = await makeOrganisation("ops-trains");
  other = await makeOrganisation("ops-trains-other");
  liftId = (await createLift(org.as.engineer, liftBody({ name: "Operations lift" }))).id;
  leadId = (await createTrain(org.as.engineer, trainBody({ name: "Lead train" }))).id;
  secondId = (await createTrain(org.as.engineer, trainBody({ name: "Second train", pawls: [1.3, 14.3] }))).id;
});
afterAll(async () => {
  await fakes.close();
  await closeDb();
});

describe("several trains in a stored scenario", () => {
  it("stores following trains, exports them as trains[1..n] and imports them back, each as its own train row", async () => {
    const eng = org.as.engineer;
    const s = await createScenario(eng, scenarioBody(liftId, leadId, { name: "Two trains", followers: [follower()] }));
    expect(s.followers).toEqual([{ trainId: secondId, trainName: "Second train", loading: "empty", riderCount: null, entrySpeed: 2.2, startPosition: 14, startTime: 12 }]);
    expect((await getScenario(eng, s.id)).followers).toHaveLength(1);

    const file = (await exportScenario(eng, s.id)).scenario;
    expect(file.trains).toHaveLength(2);
    // Empty follower: the engine's car mass is the empty car mass (trainBody: 1000 kg); the lead is full:
    // 1000 kg + 4 seats × 75 kg = 1300 kg per car.
    expect(file.trains[0]).toMatchObject({ carMass: 1300, startTime: 0, startPosition: 14 });
    expect(file.trains[1]).toMatchObject({ carMass: 1000, startTime: 12, startPosition: 14, entrySpeed: 2.2, pawls: [1.3, 14.3] });

    const before = await designCounts(org.organisationId);
    const imported = await importScenario(eng, { ...file, name: "Two trains (imported)" });
    const after = await designCounts(org.organisationId);
    // One lift, one scenario and one train row per train of the file.
    expect(after.trains - before.trains).toBe(2);
    expect(imported.followerTrains).toHaveLength(1);
    expect(imported.scenario.followers.map((f) => f.trainId)).toEqual([imported.followerTrains[0]!.id]);
    expect((await exportScenario(eng, imported.scenario.id)).scenario).toEqual({ ...file, name: "Two trains (imported)" });
  });

  it("copies the following trains to a new scenario", async () => {
    const eng = org.as.engineer;
    const s = await createScenario(eng, scenarioBody(liftId, leadId, { name: "Two trains to copy", followers: [follower({ startTime: 20 })] }));
    const copy = await copyScenario(eng, s.id, {});
    expect(copy.followers.map((f) => [f.trainId, f.startTime])).toEqual([[secondId, 20]]);
    expect((await exportScenario(eng, copy.id)).scenario.trains).toHaveLength(2);

    // What a report's approval signs keeps the following trains and their train rows.
    const file = (await exportScenario(eng, s.id)).scenario;
    const snap = await takeSnapshot({ scenarioId: s.id, runId: null, liftRevisionId: s.liftRevisionId } as Report, { inputs: file } as unknown as ReportContent);
    expect((snap.scenario!.followers as { trainId: number; startTime: number }[]).map((f) => [f.trainId, f.startTime])).toEqual([[secondId, 20]]);
    expect(snap.followerTrains?.map((t) => [t.id, t.name])).toEqual([[secondId, "Second train"]]);
    expect((snap.inputs.trains as unknown[]).length).toBe(2);
  });

  it("refuses trains that overlap at their start with the follower's path, and stores nothing", async () => {
    const eng = org.as.engineer;
    const before = await designCounts(org.organisationId);
    // Same start time, fronts 5 m apart: a 15.6 m train overlaps the other (the engine's rule, sim/schema.ts).
    const err = await expectHttpError(
      () => createScenario(eng, scenarioBody(liftId, leadId, { name: "Overlapping trains", followers: [follower({ startTime: 0, startPosition: 19 })] })),
      400,
    );
    const issue = err.issues.find((i) => i.path === "followers.0.startPosition");
    expect(issue?.message).toMatch(/^followers\.0 overlaps the lead train at their start time 0 s/);
    expect(issue?.message).toContain("(m)");
    expect(await designCounts(org.organisationId)).toEqual(before);

    // An update that makes them overlap is refused the same way and leaves the row as it was.
    const s = await createScenario(eng, scenarioBody(liftId, leadId, { name: "Trains that will overlap", followers: [follower()] }));
    const err2 = await expectHttpError(() => updateScenario(eng, s.id, { version: s.version, followers: [follower({ startTime: 0, startPosition: 20 })] }), 400);
    expect(err2.issues.map((i) => i.path)).toContain("followers.0.startPosition");
    expect((await getScenario(eng, s.id)).followers[0]!.startTime).toBe(12);
  });

  it("names each bad follower field with its path and unit", async () => {
    const eng = org.as.engineer;
    const before = await designCounts(org.organisationId);
    const err = await expectHttpError(
      () =>
        createScenario(
          eng,
          scenarioBody(liftId, leadId, {
            name: "Bad followers",
            followers: [follower({ startTime: -1 }), follower({ entrySpeed: "fast" }), follower({ loading: "riders" })],
          }),
        ),
      400,
    );
    const byPath = Object.fromEntries(err.issues.map((i) => [i.path, i.message]));
    expect(byPath["followers.0.startTime"]).toBe("followers.0.startTime must be at least 0 (s)");
    expect(byPath["followers.1.entrySpeed"]).toBe("followers.1.entrySpeed must be a finite number (m/s)");
    expect(byPath["followers.2.riderCount"]).toBe('followers.2.riderCount is required with loading "riders"');
    expect(await designCounts(org.organisationId)).toEqual(before);
  });

  it("refuses a following train of another organisation as no such train", async () => {
    const foreign = (await createTrain(other.as.engineer, trainBody({ name: "Foreign train" }))).id;
    const before = await designCounts(org.organisationId);
    const err = await expectHttpError(
      () => createScenario(org.as.engineer, scenarioBody(liftId, leadId, { name: "Foreign follower", followers: [follower({ trainId: foreign })] })),
      400,
    );
    expect(err.issues).toContainEqual({ path: "followers.0.trainId", message: `followers.0.trainId ${foreign}: no such train` });
    expect(await designCounts(org.organisationId)).toEqual(before);
  });
});

describe("a stop and a restart", () => {
  it("refuses a restart before the stop with the field path and unit, and stores nothing", async () => {
    const eng = org.as.engineer;
    const before = await designCounts(org.organisationId);
    const err = await expectHttpError(
      () =>
        createScenario(
          eng,
          scenarioBody(liftId, leadId, { name: "Restart too early", dynamics: { drive: { stop: { kind: "brake", time: 20, duration: 0.5 }, restart: { time: 10 } } } }),
        ),
      400,
    );
    expect(err.issues).toContainEqual({ path: "dynamics.drive.restart.time", message: "drive.restart.time must be later than drive.stop.time (s)" });
    expect(await designCounts(org.organisationId)).toEqual(before);
    // After the stop it is stored.
    const ok = await createScenario(
      eng,
      scenarioBody(liftId, leadId, { name: "Restart after the stop", dynamics: { drive: { stop: { kind: "brake", time: 20, duration: 0.5 }, restart: { time: 30 } } } }),
    );
    expect((await exportScenario(eng, ok.id)).scenario.drive.restart).toEqual({ time: 30 });
  });
});

describe("the logbook's run with today's chain", () => {
  it("copies the chosen scenario with the newest elongation reading, runs it, and opens the same copy on a second click", async () => {
    const op = org.as.operator;
    const eng = org.as.engineer;
    const s = await createScenario(eng, scenarioBody(liftId, leadId, { name: "Chain run source", runSettings: { duration: 6, segments: 12 } }));
    // No reading yet: refused in words, nothing made.
    const before = await designCounts(org.organisationId);
    const none = await expectHttpError(() => runWithTodaysChain(op, liftId, { scenarioId: s.id }), 409);
    expect(none.message).toMatch(/no chain elongation reading/);
    expect(await designCounts(org.organisationId)).toEqual(before);

    // Two readings over 20 pitches of the 0.1016 m chain: 2.0422 m → 0.5 %, then 2.0523 m (newer) → 1.0 %.
    // Source: elongation % = (measured − pitches × pitch) / (pitches × pitch) × 100 (common practice, no source).
    await createEntry(op, { kind: "elongation", liftId, measuredAt: "2026-03-01T08:00:00.000Z", measuredLength: 2.04216, pitches: 20, nominalPitch: 0.1016 });
    await createEntry(op, { kind: "elongation", liftId, measuredAt: "2026-06-01T08:00:00.000Z", measuredLength: 2.05232, pitches: 20, nominalPitch: 0.1016 });

    const r = await runWithTodaysChain(op, liftId, { scenarioId: s.id });
    expect(r.created).toBe(true);
    expect(r.reading.elongationPercent).toBeCloseTo(1.0, 6);
    expect(r.scenario.name).toBe("Chain run source · chain 1.00 % (2026-06-01)");
    expect(r.scenario.dynamics?.chain).toEqual({ elongation: expect.closeTo(0.01, 9) as unknown as number });
    const row = await finished(r.run.id);
    expect(row.status).toBe("done");
    expect((json(row.inputs) as { chain: { elongation: number } }).chain.elongation).toBeCloseTo(0.01, 9);
    // Audited like other writes: the scenario created and the run started, by the operator.
    const { AuditEntry } = getModels();
    expect(await AuditEntry.count({ where: { organisationId: org.organisationId, entity: "scenario", entityId: String(r.scenario.id), action: "create", userId: op.id } })).toBe(1);
    expect(await AuditEntry.count({ where: { organisationId: org.organisationId, entity: "run", entityId: String(r.run.id), userId: op.id } })).toBeGreaterThanOrEqual(1);

    // A second click opens the same copy and its run.
    const again = await runWithTodaysChain(op, liftId, { scenarioId: s.id });
    expect([again.created, again.scenario.id, again.run.id]).toEqual([false, r.scenario.id, r.run.id]);
  });

  it("takes the links removed up to the reading into the copy", async () => {
    const op = org.as.operator;
    const eng = org.as.engineer;
    const shortened = (await createLift(eng, liftBody({ name: "Shortened chain lift" }))).id;
    const s = await createScenario(eng, scenarioBody(shortened, leadId, { name: "Shortened source", runSettings: { duration: 6, segments: 12 } }));
    await createEntry(op, { kind: "links-removed", liftId: shortened, measuredAt: "2026-05-01T08:00:00.000Z", links: 4 });
    await createEntry(op, { kind: "elongation", liftId: shortened, measuredAt: "2026-06-01T08:00:00.000Z", measuredLength: 2.05232, pitches: 20, nominalPitch: 0.1016 });
    // Taken out after the reading: not part of the chain the reading measured.
    await createEntry(op, { kind: "links-removed", liftId: shortened, measuredAt: "2026-07-01T08:00:00.000Z", links: 2 });
    const r = await runWithTodaysChain(op, shortened, { scenarioId: s.id });
    expect(r.reading.linksRemoved).toBe(4);
    expect(r.scenario.name).toBe("Shortened source · chain 1.00 %, 4 links out (2026-06-01)");
    expect(r.scenario.dynamics?.chain).toEqual({ elongation: expect.closeTo(0.01, 9) as unknown as number, linksRemoved: 4 });
    expect((await finished(r.run.id)).status).toBe("done");
  });

  it("refuses a scenario of another lift, a viewer, and another organisation", async () => {
    const eng = org.as.engineer;
    const otherLift = (await createLift(eng, liftBody({ name: "Another lift" }))).id;
    const s = await createScenario(eng, scenarioBody(otherLift, leadId, { name: "Other lift's scenario" }));
    const err = await expectHttpError(() => runWithTodaysChain(org.as.operator, liftId, { scenarioId: s.id }), 400);
    expect(err.issues.map((i) => i.path)).toEqual(["scenarioId"]);
    await expectHttpError(() => runWithTodaysChain(org.as.operator, liftId, {}), 400);
    await expectHttpError(() => runWithTodaysChain(org.as.viewer, liftId, { scenarioId: s.id }), 403);
    await expectHttpError(() => runWithTodaysChain(other.as.operator, liftId, { scenarioId: s.id }), 404);
  });
});
