// A train's mass for a loading case (empty, full, part-loaded): riders and mean car mass.
import type { Loading } from "@/lib/scenarios/loading";

export interface TrainMassData {
  cars: number;
  carMassEmpty: number;
  seatsPerCar: number;
  riderMass: number;
}

/** Riders in the whole train for a loading case. */
export function ridersFor(train: TrainMassData, loading: Loading, riderCount: number | null | undefined): number {
  if (loading === "empty") return 0;
  if (loading === "full") return train.cars * train.seatsPerCar;
  return riderCount ?? 0;
}

/**
 * Mass of one car with the train's riders spread evenly over its cars: the engine treats all cars as
 * identical, so a part-loaded train is modelled by its mean car mass.
 */
export function carMassFor(train: TrainMassData, riders: number): number {
  return train.carMassEmpty + (riders * train.riderMass) / train.cars;
}

export function loadedCarMass(train: TrainMassData): number {
  return train.carMassEmpty + train.seatsPerCar * train.riderMass;
}
