import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { can, type Action } from "@/lib/auth/permissions";
import { ROLES, type Role } from "@/lib/auth/roles";
import { HttpError } from "@/lib/http/errors";
import type { Actor } from "@/lib/http/actor";
import { createLift, getLift, getRevision, listLifts, listRevisions, updateLift, deleteLift } from "@/lib/lifts/service";
import { createChainSpec, getChainSpec, listChainSpecs, updateChainSpec, deleteChainSpec } from "@/lib/chains/service";
import { createTrain, getTrain, listTrains, updateTrain, deleteTrain } from "@/lib/trains/service";
import { createScenario, exportScenario, getScenario, listScenarios, updateScenario, deleteScenario } from "@/lib/scenarios/service";
import { importScenario } from "@/lib/scenarios/import";
import { createComment, listComments } from "@/lib/comments/service";
import { listAudit } from "@/lib/audit/list";
import { closeDb, liftBody, makeOrganisation, scenarioBody, trainBody } from "./design-fixtures";

/**
 * Every design-data domain function × every role × own/other organisation, against the one permission
 * table (lib/auth/permissions.ts). Writes are probed with invalid bodies, so an allowed role gets 400
 * (it passed the permission check and then validation stopped it) and nothing is stored.
 */
let org: { organisationId: number; as: Record<Role, Actor> };
let other: { organisationId: number; as: Record<Role, Actor> };
const ids = { lift: 0, chain: 0, train: 0, scenario: 0 };

beforeAll(async () => {
  org = await makeOrganisation("perm");
  other = await makeOrganisation("perm-other");
  const eng = org.as.engineer;
  ids.lift = (await createLift(eng, liftBody())).id;
  ids.chain = (
    await createChainSpec(eng, { designation: "Perm chain", pitch: 0.1, massPerLength: 15, axialStiffness: 1.5e7, breakingStrength: 5e5, source: "Invented" })
  ).id;
  ids.train = (await createTrain(eng, trainBody())).id;
  ids.scenario = (await createScenario(eng, scenarioBody(ids.lift, ids.train))).id;
});
afterAll(closeDb);

interface Probe {
  name: string;
  action: Action;
  /** true: a row of the organisation is named, so another organisation gets 404. */
  row: boolean;
  call: (a: Actor) => Promise<unknown>;
  /** Status an allowed role gets (200 reads; 400 for writes probed with an invalid body). */
  allowed: number;
}

// The access test's default probe body: an allowed role gets 400, another organisation 404.
const BAD = {};
const probes: Probe[] = [
  { name: "listLifts", action: "design:read", row: false, allowed: 200, call: (a) => listLifts(a) },
  { name: "getLift", action: "design:read", row: true, allowed: 200, call: (a) => getLift(a, ids.lift) },
  { name: "listRevisions", action: "design:read", row: true, allowed: 200, call: (a) => listRevisions(a, ids.lift) },
  { name: "getRevision", action: "design:read", row: true, allowed: 200, call: (a) => getRevision(a, ids.lift, 1) },
  { name: "createLift", action: "design:write", row: false, allowed: 400, call: (a) => createLift(a, { name: "" }) },
  { name: "updateLift", action: "design:write", row: true, allowed: 400, call: (a) => updateLift(a, ids.lift, BAD) },
  { name: "deleteLift", action: "design:write", row: true, allowed: 0, call: (a) => deleteLift(a, ids.lift) },
  { name: "listChainSpecs", action: "design:read", row: false, allowed: 200, call: (a) => listChainSpecs(a) },
  { name: "getChainSpec", action: "design:read", row: true, allowed: 200, call: (a) => getChainSpec(a, ids.chain) },
  { name: "createChainSpec", action: "design:write", row: false, allowed: 400, call: (a) => createChainSpec(a, {}) },
  { name: "updateChainSpec", action: "design:write", row: true, allowed: 400, call: (a) => updateChainSpec(a, ids.chain, BAD) },
  { name: "deleteChainSpec", action: "design:write", row: true, allowed: 0, call: (a) => deleteChainSpec(a, ids.chain) },
  { name: "listTrains", action: "design:read", row: false, allowed: 200, call: (a) => listTrains(a) },
  { name: "getTrain", action: "design:read", row: true, allowed: 200, call: (a) => getTrain(a, ids.train) },
  { name: "createTrain", action: "design:write", row: false, allowed: 400, call: (a) => createTrain(a, {}) },
  { name: "updateTrain", action: "design:write", row: true, allowed: 400, call: (a) => updateTrain(a, ids.train, BAD) },
  { name: "deleteTrain", action: "design:write", row: true, allowed: 0, call: (a) => deleteTrain(a, ids.train) },
  { name: "listScenarios", action: "design:read", row: false, allowed: 200, call: (a) => listScenarios(a) },
  { name: "getScenario", action: "design:read", row: true, allowed: 200, call: (a) => getScenario(a, ids.scenario) },
  { name: "exportScenario", action: "design:read", row: true, allowed: 200, call: (a) => exportScenario(a, ids.scenario) },
  { name: "createScenario", action: "design:write", row: false, allowed: 400, call: (a) => createScenario(a, {}) },
  { name: "updateScenario", action: "design:write", row: true, allowed: 400, call: (a) => updateScenario(a, ids.scenario, BAD) },
  { name: "deleteScenario", action: "design:write", row: true, allowed: 0, call: (a) => deleteScenario(a, ids.scenario) },
  { name: "importScenario", action: "design:write", row: false, allowed: 400, call: (a) => importScenario(a, {}) },
  { name: "listComments", action: "design:read", row: true, allowed: 200, call: (a) => listComments(a, ids.scenario) },
  { name: "createComment", action: "comment:write", row: true, allowed: 400, call: (a) => createComment(a, ids.scenario, BAD) },
  { name: "listAudit", action: "audit:read", row: false, allowed: 200, call: (a) => listAudit(a) },
];

async function statusOf(fn: () => Promise<unknown>): Promise<number> {
  try {
    await fn();
    return 200;
  } catch (err) {
    if (err instanceof HttpError) return err.status;
    throw err;
  }
}

describe("design permission table", () => {
  // Deletes are not run for allowed roles here (they would remove the fixtures): only the refusals are checked.
  for (const p of probes) {
    it(`${p.name}: ${p.action} by role, 404 for another organisation's row`, async () => {
      for (const role of ROLES) {
        const mayAct = can(role, p.action);
        if (mayAct && p.allowed === 0) continue;
        expect({ role, status: await statusOf(() => p.call(org.as[role])) }).toEqual({ role, status: mayAct ? p.allowed : 403 });
        if (p.row) {
          // Other organisation: refused by role first (403), else the row is simply not found (404).
          expect({ role, other: await statusOf(() => p.call(other.as[role])) }).toEqual({ role, other: mayAct ? 404 : 403 });
        }
      }
    });
  }

  it("another organisation's admin cannot delete the rows either (404), and they are still there", async () => {
    for (const fn of [() => deleteLift(other.as.admin, ids.lift), () => deleteTrain(other.as.admin, ids.train), () => deleteScenario(other.as.admin, ids.scenario), () => deleteChainSpec(other.as.admin, ids.chain)]) {
      expect(await statusOf(fn)).toBe(404);
    }
    expect((await getScenario(org.as.viewer, ids.scenario)).id).toBe(ids.scenario);
  });
});
