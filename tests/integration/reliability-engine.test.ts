import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getModels } from "@/models";
import { closeJobPool } from "@/lib/jobs/pool";
import { startRun } from "@/lib/runs/service";
import { decodeResult } from "@/lib/runs/result-format";
import { HttpError } from "@/lib/http/errors";
import type { Actor } from "@/lib/http/actor";
import { closeDb, makeOrganisation } from "./design-fixtures";
import { finished, importForRuns, shortScenarioFile } from "./runs-fixtures";

/**
 * Hostile but schema-valid scenarios through the runs path (import → start → worker pool → stored row),
 * complementing tests/sim/robustness.test.ts, which calls the engine directly. Pass (sim/README.md: simulate() never returns NaN):
 * every run ends within its budget (plus the runner's grace) as done or failed with a diagnostic, and a
 * stored result holds no NaN or infinite number. Bounds: sim/schema.ts (the extremes it allows).
 */

const RUNS = process.env.FUZZ_FULL === "1" ? 30 : 6;
const BUDGET_S = 1.5;
const GRACE_MS = 12_000; // lib/runs config: the runner stops a thread 10 s after its budget at the latest

let engineer: Actor;

beforeAll(async () => {
  engineer = (await makeOrganisation("hostile-engine")).as.engineer;
});

afterAll(async () => {
  await closeJobPool();
  await closeDb();
});

function nonFinite(v: unknown, at = ""): string[] {
  if (typeof v === "number") return Number.isFinite(v) ? [] : [`${at} = ${v}`];
  if (ArrayBuffer.isView(v) && !(v instanceof DataView)) {
    const arr = v as unknown as ArrayLike<number>;
    for (let i = 0; i < arr.length; i++) if (!Number.isFinite(arr[i])) return [`${at}[${i}] = ${arr[i]}`];
    return [];
  }
  if (Array.isArray(v)) return v.flatMap((x, i) => nonFinite(x, `${at}[${i}]`));
  if (v && typeof v === "object") return Object.entries(v).flatMap(([k, x]) => nonFinite(x, at ? `${at}.${k}` : k));
  return [];
}

// Extremes the schema allows: stiff chains, tiny segments, long durations, tight tolerances, no or huge damping.
const hostile = fc.record({
  chain: fc.record({
    axialStiffness: fc.constantFrom(1e5, 1e9, 1e10),
    massPerLength: fc.constantFrom(0.5, 15, 300),
    damping: fc.constantFrom(0, 1e9),
  }),
  takeUp: fc.record({ mass: fc.constantFrom(10, 200000) }),
  run: fc.record({
    duration: fc.constantFrom(0.01, 60, 600),
    segments: fc.constantFrom(4, 500, 2000),
    integrator: fc.constantFrom("verlet", "odex"),
    stepFraction: fc.constantFrom(0.05, 0.95),
    tolerance: fc.constantFrom(1e-10, 1e-2),
  }),
});

describe("hostile but valid scenarios through the runs path", () => {
  it(`${RUNS} generated runs end within budget with a result or a diagnostic, never a non-finite number`, async () => {
    const samples = fc.sample(hostile, { seed: Number(process.env.FUZZ_SEED ?? 20261202), numRuns: RUNS });
    const { Run } = getModels();
    let started = 0;
    const outcomes: Record<string, number> = {};
    for (const [i, h] of samples.entries()) {
      const base = shortScenarioFile(`Hostile ${i}`);
      const file = {
        ...base,
        chain: { ...(base.chain as object), ...h.chain },
        takeUp: { ...(base.takeUp as object), ...h.takeUp },
        run: { ...(base.run as object), ...h.run },
      };
      let ids: { scenarioId: number };
      try {
        ids = await importForRuns(engineer, file);
      } catch (err) {
        // A combination the format refuses between fields (e.g. take-up travel) is a 400, not a hang.
        expect(err).toBeInstanceOf(HttpError);
        expect((err as HttpError).status).toBe(400);
        continue;
      }
      let view;
      try {
        view = await startRun(engineer, ids.scenarioId, { budgetSeconds: BUDGET_S, frameBudget: 50 });
      } catch (err) {
        expect((err as HttpError).status, `run ${i} refused with ${(err as Error).message}`).toBe(400);
        continue;
      }
      started += 1;
      const t0 = Date.now();
      const row = await finished(view.id);
      const what = `run ${i} ${JSON.stringify(h)}`;
      expect(Date.now() - t0, `${what} ended within its budget`).toBeLessThan(BUDGET_S * 1000 + GRACE_MS);
      expect(["done", "failed"], what).toContain(row.status);
      const full = await Run.scope("withResult").findByPk(view.id);
      const key = row.status === "failed" ? `failed/${full!.errorCode}` : "done";
      outcomes[key] = (outcomes[key] ?? 0) + 1;
      if (row.status === "failed") {
        expect(full!.errorCode, `${what}: a failure names its code`).toBeTruthy();
        expect(full!.error, `${what}: and says why`).toMatch(/\w{3,}/);
      } else {
        expect(nonFinite(full!.summary, "summary"), what).toEqual([]);
        expect(nonFinite(decodeResult(full!.result!), "result"), what).toEqual([]);
      }
      expect(nonFinite(full!.diagnostics ?? {}, "diagnostics"), what).toEqual([]);
    }
    console.log(`[hostile runs] ${samples.length} generated, ${started} started: ${JSON.stringify(outcomes)}`);
    expect(started, "some hostile runs reached the engine").toBeGreaterThan(0);
  });
});
