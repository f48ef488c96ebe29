import { z } from "zod";
import { trainSchema } from "@/sim/schema";
import { nameField, optionalText } from "@/lib/http/text";

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
  cars: trainSchema.shape.cars,
  carMassEmpty: bounded("carMassEmpty", "kg", 10, 50_000),
  seatsPerCar: bounded("seatsPerCar", "seats", 0, 40, true),
  riderMass: bounded("riderMass", "kg", 20, 250).default(DEFAULT_RIDER_MASS),
  carLength: trainSchema.shape.carLength,
  dogOffset: trainSchema.shape.dogOffset,
  rollingResistance: trainSchema.shape.rollingResistance,
  dragArea: trainSchema.shape.dragArea,
};

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
    if (t.carMassEmpty + t.seatsPerCar * t.riderMass > 50_000)
      ctx.addIssue({
        code: "custom",
        path: ["seatsPerCar"],
        message: "a full car (carMassEmpty + seatsPerCar × riderMass) must weigh at most 50000 kg",
      });
  });

export type TrainInput = z.input<typeof trainInputSchema>;
export type TrainData = z.output<typeof trainInputSchema>;
