import type { DemoScenario } from "./park";
import { demoEngineScenario } from "./build";

/** The text of public/scenarios/<key>.json: the full scenario with the format's defaults filled in. */
export function demoScenarioFile(s: DemoScenario): string {
  return JSON.stringify(demoEngineScenario(s), null, 2) + "\n";
}
