import fs from "node:fs";
import path from "node:path";
import { expect, request, test, type APIRequestContext } from "@playwright/test";
import { apiAs, baseURL } from "./support/auth";

/**
 * Runs over HTTP against the real server (next start) and the seeded demo park: start a run, follow it
 * to done by server-sent events and by polling, read the result, and the answers for wrong roles and
 * another organisation.
 */
const example = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "..", "sim", "examples", "lift-hill-example.json"), "utf8"));
// A short version of the example so each run takes well under a second.
const shortRun = { ...example.run, duration: 8, segments: 30 };

let anon: APIRequestContext;
let engineer: APIRequestContext;
let operator: APIRequestContext;
let viewer: APIRequestContext;
let outsider: APIRequestContext;
let scenarioId: number;

test.beforeAll(async () => {
  anon = await request.newContext({ baseURL });
  engineer = await apiAs("engineer@lanternfell.example");
  operator = await apiAs("operator@lanternfell.example");
  viewer = await apiAs("viewer@lanternfell.example");
  outsider = await apiAs("engineer@cardlevane.example");
  const imported = await engineer.post("/api/scenarios/import", {
    data: { ...example, name: `HTTP runs ${Date.now()} ${process.pid}`, run: shortRun },
  });
  expect(imported.status()).toBe(201);
  scenarioId = (await imported.json()).scenario.id;
});

test.afterAll(async () => {
  for (const c of [anon, engineer, operator, viewer, outsider]) await c?.dispose();
});

interface RunBody {
  id: number;
  status: string;
  progress: number;
  version: number;
  summary: Record<string, number> | null;
}

async function poll(ctx: APIRequestContext, id: number): Promise<RunBody> {
  for (let i = 0; i < 150; i++) {
    const res = await ctx.get(`/api/runs/${id}`);
    expect(res.status()).toBe(200);
    const run = (await res.json()) as RunBody;
    if (["done", "failed", "cancelled"].includes(run.status)) return run;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`run ${id} did not finish`);
}

test("an operator starts a run, follows its progress to done and reads the result", async () => {
  const started = await operator.post(`/api/scenarios/${scenarioId}/runs`, { data: { frameBudget: 100 } });
  expect(started.status()).toBe(202);
  const { run } = (await started.json()) as { run: RunBody };
  expect(run.status).toBe("queued");
  expect(started.headers()["location"]).toBe(`/api/runs/${run.id}`);

  // Server-sent events until the end event.
  const events = await operator.get(`/api/runs/${run.id}/events`, { timeout: 60_000 });
  expect(events.status()).toBe(200);
  expect(events.headers()["content-type"]).toContain("text/event-stream");
  const text = await events.text();
  const names = [...text.matchAll(/^event: (\w+)$/gm)].map((m) => m[1]);
  expect(names.at(-1)).toBe("end");
  const end = JSON.parse(text.trim().split("\n").at(-1)!.replace(/^data: /, "")) as RunBody;
  expect(end.status).toBe("done");

  // Polling gives the same final state.
  const polled = await poll(operator, run.id);
  expect(polled.status).toBe("done");
  expect(polled.progress).toBe(1);
  expect(polled.summary!.peakTension).toBeGreaterThan(0);

  const result = await operator.get(`/api/runs/${run.id}/result`);
  expect(result.status()).toBe(200);
  const body = (await result.json()) as { format: string; summary: Record<string, number>; result: { series: Record<string, number[]>; frames: unknown[] } };
  expect(body.format).toBe("tautline-result/1");
  expect(body.summary.peakTension).toBe(polled.summary!.peakTension);
  expect(body.result.series.t.length).toBeGreaterThan(100);
  expect(body.result.series.t.length).toBe(body.result.series.trainSpeed.length);
  expect(body.result.frames.length).toBeLessThanOrEqual(101);

  const binary = await operator.get(`/api/runs/${run.id}/result?format=binary`);
  expect(binary.status()).toBe(200);
  expect(binary.headers()["content-type"]).toBe("application/octet-stream");
  const bytes = await binary.body();
  expect([bytes[0], bytes[1]]).toEqual([0x1f, 0x8b]); // gzip magic (RFC 1952)

  const list = await viewer.get(`/api/scenarios/${scenarioId}/runs?pageSize=5`);
  expect(list.status()).toBe(200);
  const page = (await list.json()) as { items: RunBody[]; total: number };
  expect(page.items.map((r) => r.id)).toContain(run.id);
});

test("a viewer may read runs but not start, cancel or delete them", async () => {
  const res = await viewer.post(`/api/scenarios/${scenarioId}/runs`, { data: {} });
  expect(res.status()).toBe(403);
  const list = (await (await viewer.get(`/api/scenarios/${scenarioId}/runs`)).json()) as { items: RunBody[] };
  const id = list.items[0]?.id;
  expect(id).toBeDefined();
  expect((await viewer.post(`/api/runs/${id}/cancel`)).status()).toBe(403);
  expect((await viewer.delete(`/api/runs/${id}?version=1`)).status()).toBe(403);
  expect((await viewer.get(`/api/runs/${id}`)).status()).toBe(200);
});

test("anonymous callers get 401; another organisation gets 404", async () => {
  expect((await anon.post(`/api/scenarios/${scenarioId}/runs`, { data: {} })).status()).toBe(401);
  expect((await anon.get(`/api/scenarios/${scenarioId}/runs`)).status()).toBe(401);
  const list = (await (await engineer.get(`/api/scenarios/${scenarioId}/runs`)).json()) as { items: RunBody[] };
  const id = list.items[0]!.id;
  expect((await anon.get(`/api/runs/${id}`)).status()).toBe(401);
  expect((await outsider.post(`/api/scenarios/${scenarioId}/runs`, { data: {} })).status()).toBe(404);
  expect((await outsider.get(`/api/scenarios/${scenarioId}/runs`)).status()).toBe(404);
  for (const url of [`/api/runs/${id}`, `/api/runs/${id}/result`, `/api/runs/${id}/events`]) {
    expect((await outsider.get(url)).status(), url).toBe(404);
  }
  expect((await outsider.post(`/api/runs/${id}/cancel`)).status()).toBe(404);
  expect((await outsider.delete(`/api/runs/${id}?version=1`)).status()).toBe(404);
  expect((await engineer.get(`/api/runs/99999999`)).status()).toBe(404);
  expect((await engineer.get(`/api/runs/abc`)).status()).toBe(404);
});

test("bad solver settings answer 400 with the field path; an engineer cancels and deletes a run", async () => {
  const bad = await engineer.post(`/api/scenarios/${scenarioId}/runs`, { data: { segments: 1, frameBudget: "many", extra: true } });
  expect(bad.status()).toBe(400);
  const issues = ((await bad.json()) as { issues: { path: string }[] }).issues.map((i) => i.path);
  expect(issues).toEqual(expect.arrayContaining(["segments", "frameBudget"]));

  // A long run (600 s simulated on 200 segments) to cancel while it runs.
  const started = await engineer.post(`/api/scenarios/${scenarioId}/runs`, { data: { duration: 600, segments: 200 } });
  expect(started.status()).toBe(202);
  const { run } = (await started.json()) as { run: RunBody };
  const cancelled = await engineer.post(`/api/runs/${run.id}/cancel`);
  expect(cancelled.status()).toBe(200);
  expect(((await cancelled.json()) as RunBody).status).toBe("cancelled");
  expect((await engineer.post(`/api/runs/${run.id}/cancel`)).status()).toBe(409);
  expect((await engineer.get(`/api/runs/${run.id}/result`)).status()).toBe(409);

  const current = (await (await engineer.get(`/api/runs/${run.id}`)).json()) as RunBody;
  expect((await engineer.delete(`/api/runs/${run.id}`)).status()).toBe(400);
  expect((await engineer.delete(`/api/runs/${run.id}?version=${current.version + 3}`)).status()).toBe(409);
  expect((await engineer.delete(`/api/runs/${run.id}?version=${current.version}`)).status()).toBe(204);
  expect((await engineer.get(`/api/runs/${run.id}`)).status()).toBe(404);
});

test("a what-if run over HTTP: the server applies and returns the overrides; bad ones answer 400 with the path and store nothing", async () => {
  const total = async () => ((await (await engineer.get(`/api/scenarios/${scenarioId}/runs?pageSize=1`)).json()) as { total: number }).total;
  const before = await total();
  for (const [data, path] of [
    [{ overrides: { takeUpMass: -5 } }, "overrides.takeUpMass"],
    [{ overrides: { takeUpMass: null } }, "overrides.takeUpMass"],
    [{ overrides: { entrySpeed: 2, gust: 1 } }, "overrides"],
  ] as const) {
    const bad = await engineer.post(`/api/scenarios/${scenarioId}/runs`, { data });
    expect(bad.status()).toBe(400);
    expect(((await bad.json()) as { issues: { path: string }[] }).issues.map((i) => i.path)).toContain(path);
  }
  expect(await total()).toBe(before);

  const started = await engineer.post(`/api/scenarios/${scenarioId}/runs`, { data: { overrides: { takeUpMass: 6000 } } });
  expect(started.status()).toBe(202);
  const { run } = (await started.json()) as { run: RunBody & { overrides: unknown; overridesFrom: unknown } };
  // The example lift hill's own take-up mass is 5000 kg (sim/examples/lift-hill-example.json).
  expect(run.overrides).toEqual({ takeUpMass: 6000 });
  expect(run.overridesFrom).toEqual({ takeUpMass: 5000 });
  expect((await poll(engineer, run.id)).status).toBe("done");
  const read = (await (await engineer.get(`/api/runs/${run.id}`)).json()) as { overrides: unknown; inputs: { takeUp: { mass: number } } };
  expect(read.overrides).toEqual({ takeUpMass: 6000 });
  expect(read.inputs.takeUp.mass).toBe(6000);
  expect(await total()).toBe(before + 1);
});
