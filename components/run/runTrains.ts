/**
 * The trains of a run with the signals the run holds for each. The engine's series and frames describe
 * the first train today; every read-out goes through this list so a run with more trains needs no change
 * beyond it.
 */
import type { Series, TrainSettings } from "@/sim";
import type { RunData } from "./types";

export interface RunTrain {
  index: number;
  /** "Train 2" when the scenario has several, else "" (one train needs no name). */
  label: string;
  train: TrainSettings;
  series: Series;
}

export function runTrains(data: Pick<RunData, "scenario" | "series">): RunTrain[] {
  const many = data.scenario.trains.length > 1;
  return data.scenario.trains.slice(0, 1).map((train, index) => ({ index, label: many ? `Train ${index + 1}` : "", train, series: data.series }));
}
