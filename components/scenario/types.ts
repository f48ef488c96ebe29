import type { Jsonify } from "@/lib/client/jsonify";
import type { ScenarioView } from "@/lib/scenarios/service";

/** A scenario as the API answers it (dates as strings). */
export type ScenarioJson = Jsonify<ScenarioView>;

export const LOADING_LABELS: Record<ScenarioJson["loading"], string> = { empty: "Empty train", full: "Full train", riders: "Some riders" };
