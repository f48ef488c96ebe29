import type { ScenarioView } from "@/lib/scenarios/service";

/** A scenario as the API answers it (dates as strings). */
export type ScenarioJson = Omit<ScenarioView, "archivedAt" | "frozenAt" | "createdAt" | "updatedAt"> & {
  archivedAt: string | null;
  frozenAt: string | null;
  createdAt: string;
  updatedAt: string;
};

export const LOADING_LABELS: Record<ScenarioJson["loading"], string> = { empty: "Empty train", full: "Full train", riders: "Some riders" };
