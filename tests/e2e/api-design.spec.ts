import fs from "node:fs";
import path from "node:path";
import { expect, request, test, type APIRequestContext } from "@playwright/test";
import { apiAs, baseURL } from "./support/auth";

/**
 * The design-data API over HTTP against the real server and the seeded demo park: status codes and
 * answers for anonymous callers, wrong roles, another organisation, bad input and stale updates.
 */
const example = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "..", "sim", "examples", "lift-hill-example.json"), "utf8"));

let anon: APIRequestContext;
let engineer: APIRequestContext;
let viewer: APIRequestContext;
let reviewer: APIRequestContext;
let outsider: APIRequestContext;
let parkLiftId: number;
let parkScenarioId: number;

test.beforeAll(async () => {
  anon = await request.newContext({ baseURL });
  engineer = await apiAs("engineer@lanternfell.example");
  viewer = await apiAs("viewer@lanternfell.example");
  reviewer = await apiAs("reviewer@lanternfell.example");
  outsider = await apiAs("engineer@cardlevane.example");
  const lifts = await (await engineer.get("/api/lifts?sort=name")).json();
  expect(lifts.total).toBeGreaterThan(0);
  parkLiftId = lifts.items[0].id;
  const scenarios = await (await engineer.get("/api/scenarios?sort=name")).json();
  expect(scenarios.total).toBeGreaterThan(0);
  parkScenarioId = scenarios.items[0].id;
});

test.afterAll(async () => {
  for (const c of [anon, engineer, viewer, reviewer, outsider]) await c?.dispose();
});

test("anonymous callers get 401 on reads and writes", async () => {
  for (const url of ["/api/lifts", "/api/trains", "/api/chain-specs", "/api/scenarios", "/api/audit", `/api/lifts/${parkLiftId}`, `/api/scenarios/${parkScenarioId}/export`]) {
    expect((await anon.get(url)).status(), url).toBe(401);
  }
  expect((await anon.post("/api/lifts", { data: {} })).status()).toBe(401);
  expect((await anon.post("/api/scenarios/import", { data: example })).status()).toBe(401);
});

test("a role that may not write gets 403; reading is open to every role of the organisation", async () => {
  expect((await viewer.post("/api/lifts", { data: {} })).status()).toBe(403);
  expect((await viewer.post("/api/scenarios/import", { data: example })).status()).toBe(403);
  expect((await reviewer.patch(`/api/lifts/${parkLiftId}`, { data: { version: 1 } })).status()).toBe(403);
  expect((await viewer.delete(`/api/scenarios/${parkScenarioId}`)).status()).toBe(403);
  expect((await viewer.get("/api/audit")).status()).toBe(403);
  expect((await viewer.get(`/api/lifts/${parkLiftId}`)).status()).toBe(200);
  expect((await reviewer.get("/api/audit")).status()).toBe(200);
});

test("another organisation's rows answer 404, never 403", async () => {
  expect((await outsider.get(`/api/lifts/${parkLiftId}`)).status()).toBe(404);
  expect((await outsider.get(`/api/lifts/${parkLiftId}/revisions`)).status()).toBe(404);
  expect((await outsider.get(`/api/lifts/${parkLiftId}/revisions/1`)).status()).toBe(404);
  expect((await outsider.patch(`/api/lifts/${parkLiftId}`, { data: { version: 1, name: "Taken" } })).status()).toBe(404);
  expect((await outsider.get(`/api/scenarios/${parkScenarioId}/export`)).status()).toBe(404);
  expect((await outsider.delete(`/api/scenarios/${parkScenarioId}`)).status()).toBe(404);
  const theirList = await (await outsider.get("/api/lifts?pageSize=100")).json();
  expect(theirList.items.map((l: { id: number }) => l.id)).not.toContain(parkLiftId);
});

test("bad input answers 400 with field paths and stores nothing", async () => {
  // A unique name, so other test files writing to the demo park at the same time cannot disturb the check.
  const name = `Bad lift ${Date.now()}`;
  const res = await engineer.post("/api/lifts", {
    data: { name, lift: { ...example.lift, angle: 95 }, chain: { chainSpecId: 999999 }, drive: { speed: 2 }, takeUp: example.takeUp, antiRollback: example.antiRollback },
  });
  expect(res.status()).toBe(400);
  const paths = ((await res.json()).issues as { path: string }[]).map((i) => i.path);
  expect(paths).toEqual(expect.arrayContaining(["lift.angle", "chain.chainSpecId", "drive.sprocketTeeth"]));
  expect((await (await engineer.get(`/api/lifts?archived=all&q=${encodeURIComponent(name)}`)).json()).total).toBe(0);

  const sort = await engineer.get("/api/scenarios?sort=secret");
  expect(sort.status()).toBe(400);
  expect((await sort.json()).issues.map((i: { path: string }) => i.path)).toEqual(["sort"]);

  const notJson = await engineer.post("/api/trains", { headers: { "content-type": "text/plain" }, data: "cars=6" });
  expect(notJson.status()).toBe(400);

  const file = await engineer.post("/api/scenarios/import", {
    data: { ...example, lift: { ...example.lift, angle: 0 }, drive: { ...example.drive, speed: -1 }, run: { duration: 0 } },
  });
  expect(file.status()).toBe(400);
  expect((await file.json()).issues.map((i: { path: string }) => i.path)).toEqual(expect.arrayContaining(["lift.angle", "drive.speed", "run.duration"]));
});

test("a stale update answers 409 with the current version; import, export and delete round trip", async () => {
  const imported = await engineer.post("/api/scenarios/import", { data: { ...example, name: `HTTP import ${Date.now()}` } });
  expect(imported.status()).toBe(201);
  const { scenario, lift, train } = await imported.json();

  const exported = await engineer.get(`/api/scenarios/${scenario.id}/export`);
  expect(exported.status()).toBe(200);
  expect(exported.headers()["content-disposition"]).toMatch(/attachment; filename=".+\.tautline\.json"/);
  const file = await exported.json();
  // Exports write format 2 (the example file is format 1, converted on import: its train is trains[0]).
  expect([file.format, file.lift, file.trains[0].carMass, file.run.duration]).toEqual(["tautline-scenario/2", example.lift, example.train.carMass, example.run.duration]);

  const first = await engineer.patch(`/api/trains/${train.id}`, { data: { version: 1, dragArea: 1.2 } });
  expect(first.status()).toBe(200);
  const stale = await engineer.patch(`/api/trains/${train.id}`, { data: { version: 1, dragArea: 1.4 } });
  expect(stale.status()).toBe(409);
  expect(stale.headers()["x-current-version"]).toBe("2");
  expect((await (await engineer.get(`/api/trains/${train.id}`)).json()).dragArea).toBe(1.2);

  const saved = await engineer.patch(`/api/lifts/${lift.id}`, { data: { version: 1, drive: { speed: 2.0 }, changeSummary: "Slower chain" } });
  expect(saved.status()).toBe(200);
  expect((await saved.json()).changes).toEqual([{ path: "drive.speed", before: 2.5, after: 2 }]);
  const rev2 = await (await viewer.get(`/api/lifts/${lift.id}/revisions/2`)).json();
  expect(rev2.changes).toEqual([{ path: "drive.speed", before: 2.5, after: 2 }]);
  // The scenario stays pinned to revision 1: its export is unchanged.
  expect((await (await engineer.get(`/api/scenarios/${scenario.id}/export`)).json()).drive.speed).toBe(2.5);

  const comment = await reviewer.post(`/api/scenarios/${scenario.id}/comments`, { data: { body: "Checked over HTTP." } });
  expect(comment.status()).toBe(201);
  expect((await viewer.post(`/api/scenarios/${scenario.id}/comments`, { data: { body: "x" } })).status()).toBe(403);

  // With a comment the scenario is archived (kept), and then the lift and train are archived as used.
  expect(await (await engineer.delete(`/api/scenarios/${scenario.id}`)).json()).toEqual({ id: scenario.id, outcome: "archived" });
  expect(await (await engineer.delete(`/api/lifts/${lift.id}`)).json()).toEqual({ id: lift.id, outcome: "archived" });
  expect(await (await engineer.delete(`/api/trains/${train.id}`)).json()).toEqual({ id: train.id, outcome: "archived" });
  const audit = await (await reviewer.get(`/api/audit?entity=train&entityId=${train.id}&order=asc`)).json();
  expect(audit.items.map((a: { action: string }) => a.action)).toEqual(["import", "update", "archive"]);
});
