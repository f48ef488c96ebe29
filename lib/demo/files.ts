import type { DemoScenario } from "./park";
import { demoScenarioInput } from "./build";

/** The text of public/scenarios/<key>.json: the scenario as park.ts gives it (engine defaults left out). */
export function demoScenarioFile(s: DemoScenario): string {
  return JSON.stringify(demoScenarioInput(s), null, 2) + "\n";
}
