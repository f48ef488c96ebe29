// Writes the demo scenarios as tautline-scenario/2 files into public/scenarios/ (served at /scenarios/<key>.json).
// Usage: npm run demo:export   (tests/unit/runs-demo-scenarios.test.ts fails when the files are out of date)
import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import { DEMO_SCENARIOS } from "./park";
import { demoScenarioFile } from "./files";

function main(): void {
  const dir = path.resolve(__dirname, "..", "..", "public", "scenarios");
  mkdirSync(dir, { recursive: true });
  for (const s of DEMO_SCENARIOS) {
    const file = path.join(dir, `${s.key}.json`);
    writeFileSync(file, demoScenarioFile(s));
    console.log(`wrote public/scenarios/${s.key}.json`);
  }
}

main();
