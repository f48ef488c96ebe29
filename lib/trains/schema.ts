import { z } from "zod";
import { trainSchema, trainSchemaV1 } from "@/sim/schema";
import { nameField, optionalText } from "@/lib/http/text";
import { withoutDefault } from "@/lib/scenarios/dynamics";

/** Mass of one rider when none is given: 75 kg, an assumption the user can change (no source). */
export const DEFAULT_RIDER_MASS = 75;

const bounded = (field: string, unit: string, min: number, max: number, int = false) => {
  let s = z.number({ error: `${field} must be a finite number (${unit})` });
  if (int) s = s.int({ error: `${field} must be a whole number` });
  return s
    .min(min, { error: `${field} must be at least ${min} (${unit})` })
    .max(max, { error: `${field} must be at most ${max} (${unit})` });
};

const fields = {
  name: nameField("name"),
  notes: optionalText("notes", 5000),
  cars: trainSchemaV1.shape.cars,
  carMassEmpty: bounded("carMassEmpty", "kg", 10, 50_000),
  seatsPerCar: bounded("seatsPerCar", "seats", 0, 40, true),
  riderMass: bounded("riderMass", "kg", 20, 250).default(DEFAULT_RIDER_MASS),
  carLength: trainSchemaV1.shape.carLength,
  dogOffset: trainSchemaV1.shape.dogOffset,
  rollingResistance: trainSchemaV1.shape.rollingResistance,
  dragArea: trainSchemaV1.shape.dragArea,
  /** m behind the front, the train's ARD pawls (the engine's rule); null/absent = one pawl at the dog. */
  pawls: (withoutDefault(trainSchema.shape.pawls) as z.ZodType<number[]>).nullish(),
};

/**
 * The engine writes one message for every train of a list ("trains.*.pawls.* must be at least 0 (m)").
 * A train row is not in a list: drop the "trains.*." and put the issue's own indexes in for the rest.
 */
export function trainIssueMessage(message: string, path: readonly PropertyKey[]): string {
  const idx = path.filter((p) => typeof p === "number").map(String);
  return message.replace(/^trains\.\*\./, "").replace(/\.\*/g, () => `.${idx.shift() ?? "*"}`);
}

/** Issues of `trainInputSchema` with their messages made for a train row (see trainIssueMessage). */
export function trainIssues(issues: ReadonlyArray<{ path: readonly PropertyKey[]; message: string }>) {
  return issues.map((i) => ({ path: i.path, message: trainIssueMessage(i.message, i.path) }));
}

/** A train as the API takes it (SI units). Loaded car mass = carMassEmpty + seatsPerCar × riderMass. */
export const trainInputSchema = z
  .object(fields)
  .strict()
  .superRefine((t, ctx) => {
    if (t.dogOffset > t.cars * t.carLength)
      ctx.addIssue({
        code: "custom",
        path: ["dogOffset"],
        message: "dogOffset must not exceed the train length (cars × carLength)",
      });
    const length = t.cars * t.carLength;
    (t.pawls ?? []).forEach((p, i) => {
      if (p > length)
        ctx.addIssue({ code: "custom", path: ["pawls", i], message: `pawls.${i} must lie on the train (at most cars × carLength = ${length.toFixed(2)} m behind the front)` });
    });
    if (t.carMassEmpty + t.seatsPerCar * t.riderMass > 50_000)
      ctx.addIssue({
        code: "custom",
        path: ["seatsPerCar"],
        message: "a full car (carMassEmpty + seatsPerCar × riderMass) must weigh at most 50000 kg",
      });
  });

export type TrainInput = z.input<typeof trainInputSchema>;
export type TrainData = z.output<typeof trainInputSchema>;

/** A train's stored fields, picked from a row or a definition that holds them (no pawls given: null). */
export function trainFields(t: Omit<TrainData, "pawls"> & { pawls?: TrainData["pawls"] }): TrainData {
  return {
    name: t.name,
    notes: t.notes,
    cars: t.cars,
    carMassEmpty: t.carMassEmpty,
    seatsPerCar: t.seatsPerCar,
    riderMass: t.riderMass,
    carLength: t.carLength,
    dogOffset: t.dogOffset,
    rollingResistance: t.rollingResistance,
    dragArea: t.dragArea,
    pawls: t.pawls ?? null,
  };
}
