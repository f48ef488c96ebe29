import { readFileSync } from "node:fs";
import path from "node:path";
import { getModels } from "@/models";
import type { Actor } from "@/lib/http/actor";
import { importScenario } from "@/lib/scenarios/import";
import { waitForJob } from "@/lib/runs/runner";

/** The example lift hill of the scenario format, shortened so a run takes a fraction of a second. */
export function shortScenarioFile(name: string, run: Record<string, unknown> = {}): Record<string, unknown> {
  const file = JSON.parse(readFileSync(path.join(process.cwd(), "sim", "examples", "lift-hill-example.json"), "utf8"));
  return { ...file, name, run: { ...file.run, duration: 8, segments: 30, ...run } };
}

/** Imports a scenario file for `actor` and returns the new scenario's, lift's and train's ids. */
export async function importForRuns(actor: Actor, file: Record<string, unknown>) {
  const r = await importScenario(actor, file);
  return { scenarioId: r.scenario.id, liftId: r.lift.id, trainId: r.train.id };
}

/** Waits until the run's row satisfies `pred` (polling the database, as a client would). */
export async function waitForRow(runId: number, pred: (r: { status: string; progress: number }) => boolean, timeoutMs = 30_000) {
  const { Run } = getModels();
  const until = Date.now() + timeoutMs;
  for (;;) {
    const row = await Run.findByPk(runId);
    if (row && pred(row)) return row;
    if (Date.now() > until) throw new Error(`run ${runId} did not reach the expected state (now ${row?.status} ${row?.progress})`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

export async function finished(runId: number) {
  await waitForJob(runId);
  return waitForRow(runId, (r) => ["done", "failed", "cancelled"].includes(r.status));
}

export async function runCount(organisationId: number): Promise<number> {
  return getModels().Run.count({ where: { organisationId } });
}

/** Summary figures that depend only on the inputs (wall time differs from one call to the next). */
export function deterministic(summary: Record<string, unknown>) {
  const { wallTimeMs: _w, ...rest } = summary;
  void _w;
  return rest;
}
