import fs from "node:fs";
import path from "node:path";
import { expect, type APIRequestContext } from "@playwright/test";

/** The scenario format's example lift hill (sim/examples), as the import API takes it. */
export const exampleScenario = JSON.parse(fs.readFileSync(path.join(__dirname, "..", "..", "..", "sim", "examples", "lift-hill-example.json"), "utf8"));

/** Imports a short copy of the example as `name`, runs it over HTTP and waits until the run is done. */
export async function finishedRun(api: APIRequestContext, name: string) {
  const imported = await api.post("/api/scenarios/import", { data: { ...exampleScenario, name, run: { ...exampleScenario.run, duration: 8, segments: 16 } } });
  expect(imported.status()).toBe(201);
  const scenarioId = (await imported.json()).scenario.id as number;
  const started = await api.post(`/api/scenarios/${scenarioId}/runs`, { data: {} });
  expect(started.status()).toBe(202);
  const runId = (await started.json()).run.id as number;
  let run: { status: string; summary: Record<string, number>; version: number } | undefined;
  await expect
    .poll(async () => {
      run = await (await api.get(`/api/runs/${runId}`)).json(); // the run itself
      return run!.status;
    }, { timeout: 30_000 })
    .toBe("done");
  return { scenarioId, runId, run: run! };
}
