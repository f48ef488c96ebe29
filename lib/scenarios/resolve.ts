import type { Scenario as EngineScenario } from "@/sim/schema";
import { badRequest } from "@/lib/http/errors";
import { resolveEngineScenario, type RevisionLike, type ScenarioLike, type TrainLike } from "./engine";

export {
  engineScenarioInput,
  resolveEngineScenario,
  toScenarioIssue,
  type ResolveResult,
  type RevisionLike,
  type ScenarioLike,
  type TrainLike,
} from "./engine";

/**
 * The full `tautline-scenario/1` object for a saved scenario, its pinned lift revision and its train,
 * validated by the engine's `scenarioSchema` (export = this JSON; runs start from it). Throws a 400
 * listing the problems if the stored data no longer makes a valid scenario.
 */
export function toEngineScenario(scenario: ScenarioLike, liftRevision: RevisionLike, train: TrainLike, followerTrains: readonly TrainLike[] = []): EngineScenario {
  const r = resolveEngineScenario(scenario, liftRevision, train, followerTrains);
  if (!r.ok) throw badRequest("This scenario does not make a valid engine scenario.", r.issues);
  return r.scenario;
}
