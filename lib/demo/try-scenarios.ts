// Development aid: runs every demo scenario with the engine and checks the figures each one is meant to show.
// Usage: npx tsx lib/demo/try-scenarios.ts
import { simulate } from "@/sim/simulate";
import { DEMO_SCENARIOS } from "./park";
import { demoEngineScenario } from "./build";
import { checkDemoExpectations } from "./expectations";

const sources = new Map<string, Parameters<typeof checkDemoExpectations>[1] extends Map<string, infer V> ? V : never>();
for (const def of DEMO_SCENARIOS) {
  const inputs = demoEngineScenario(def);
  const t0 = Date.now();
  const r = simulate(inputs);
  sources.set(def.key, { summary: r.summary as unknown as Record<string, unknown>, series: r.series, inputs });
  console.log(`${def.key}: ${Date.now() - t0} ms`);
}
for (const def of DEMO_SCENARIOS) {
  for (const c of checkDemoExpectations(def, sources)) {
    console.log(`${c.ok ? "ok  " : "FAIL"} ${def.key}: ${c.text}`);
  }
}
