import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { parseScenario } from "@/sim/schema";
import { simulate } from "@/sim/simulate";
import { DEMO_LIFTS, DEMO_SCENARIOS, DEMO_TRAINS } from "@/lib/demo/park";
import { demoEngineScenario } from "@/lib/demo/build";
import { demoScenarioFile } from "@/lib/demo/files";
import { checkDemoExpectations } from "@/lib/demo/expectations";
import type { FigureSource } from "@/lib/demo/figures";

const dir = path.join(process.cwd(), "public", "scenarios");

describe("the demo scenario files in public/scenarios", () => {
  const files = readdirSync(dir).filter((f) => f.endsWith(".json"));

  it("are one per demo scenario", () => {
    expect(files.sort()).toEqual(DEMO_SCENARIOS.map((s) => `${s.key}.json`).sort());
    expect(DEMO_SCENARIOS.length).toBeGreaterThanOrEqual(6);
    expect(DEMO_LIFTS).toHaveLength(3);
    expect(DEMO_TRAINS).toHaveLength(2);
  });

  it.each(DEMO_SCENARIOS.map((s) => [s.key, s] as const))("%s validates and is up to date (npm run demo:export)", (key, def) => {
    const text = readFileSync(path.join(dir, `${key}.json`), "utf8");
    const parsed = parseScenario(JSON.parse(text));
    expect(parsed.ok ? [] : parsed.issues).toEqual([]);
    expect(text).toBe(demoScenarioFile(def));
    // With the engine's defaults filled in, the file is exactly the scenario the seed runs.
    expect(parsed.ok && parsed.scenario).toEqual(demoEngineScenario(def));
  });
});

describe("the demo scenarios show their phenomena when the engine runs them", () => {
  // Our own criteria (lib/demo/park.ts): common practice, no source — e.g. the default snatch limit of 2
  // and the required safety factor of 5 are sim/schema.ts defaults, marked there as assumptions.
  const runs = new Map<string, FigureSource>();
  for (const def of DEMO_SCENARIOS) {
    const inputs = demoEngineScenario(def);
    const r = simulate(inputs);
    runs.set(def.key, { summary: r.summary as unknown as Record<string, unknown>, series: r.series, inputs });
  }

  it.each(DEMO_SCENARIOS.map((s) => [s.key, s] as const))("%s", (_key, def) => {
    expect(def.expect.length).toBeGreaterThan(0);
    const failed = checkDemoExpectations(def, runs).filter((c) => !c.ok).map((c) => c.text);
    expect(failed).toEqual([]);
  });
});
