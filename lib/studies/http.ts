import { z } from "zod";

const intParam = (name: string, min: number, max: number, fallback: number) =>
  z.coerce
    .number({ error: `${name} must be a whole number` })
    .int({ error: `${name} must be a whole number` })
    .min(min, { error: `${name} must be at least ${min}` })
    .max(max, { error: `${name} must be at most ${max}` })
    .default(fallback);

export const listStudiesQuerySchema = z.object({
  scenarioId: z.coerce.number({ error: "scenarioId must be a whole number" }).int().positive().optional(),
  page: intParam("page", 1, 100_000, 1),
  pageSize: intParam("pageSize", 1, 100, 20),
});

export const unitsQuerySchema = z.object({
  units: z.enum(["si", "us"], { error: "units must be si or us" }).optional(),
});

export const exportQuerySchema = unitsQuerySchema.extend({
  format: z.enum(["csv", "xlsx"], { error: "format must be csv or xlsx" }).default("csv"),
});

export const listReportsQuerySchema = z.object({
  scenarioId: z.coerce.number({ error: "scenarioId must be a whole number" }).int().positive().optional(),
  status: z.enum(["draft", "submitted", "returned", "approved"], { error: "status must be draft, submitted, returned or approved" }).optional(),
});
