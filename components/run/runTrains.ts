/**
 * The trains of a run with each one's own signals (series.trains[j]; a run saved before those existed
 * has only the flat keys, which describe the first train). Every per-train read-out goes through this list.
 */
import type { Series, TrainSettings } from "@/sim";
import type { RunData } from "./types";

export interface TrainSignals {
  t: number[];
  trainPosition: number[];
  trainSpeed: number[];
  ardForce: number[];
}

export interface RunTrain {
  index: number;
  /** "Train 2" when the scenario has several, else "" (one train needs no name). */
  label: string;
  train: TrainSettings;
  signals: TrainSignals;
}

function signalsOf(series: Series, j: number): TrainSignals | null {
  const own = series.trains?.[j];
  if (own) return { t: series.t, trainPosition: own.position, trainSpeed: own.speed, ardForce: own.ardForce };
  return j === 0 ? { t: series.t, trainPosition: series.trainPosition, trainSpeed: series.trainSpeed, ardForce: series.ardForce } : null;
}

export function runTrains(data: Pick<RunData, "scenario" | "series">): RunTrain[] {
  const many = data.scenario.trains.length > 1;
  return data.scenario.trains.flatMap((train, index) => {
    const signals = signalsOf(data.series, index);
    return signals ? [{ index, label: many ? `Train ${index + 1}` : "", train, signals }] : [];
  });
}
