export interface ScenarioJson {
  id: number;
  name: string;
  notes: string | null;
  liftId: number;
  liftName: string | null;
  liftRevisionId: number;
  liftRevisionNumber: number | null;
  pinnedToCurrent: boolean;
  trainId: number;
  trainName: string | null;
  loading: "empty" | "full" | "riders";
  riderCount: number | null;
  riders: number | null;
  carMass: number | null;
  entrySpeed: number;
  startPosition: number;
  runSettings: Record<string, unknown>;
  version: number;
  archivedAt: string | null;
  frozenAt: string | null;
  createdAt: string;
  updatedAt: string;
}

export const LOADING_LABELS: Record<ScenarioJson["loading"], string> = { empty: "Empty train", full: "Full train", riders: "Some riders" };
