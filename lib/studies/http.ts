import { z } from "zod";
import { pagingFields } from "@/lib/http/list-query";

export const listStudiesQuerySchema = z.object({
  scenarioId: z.coerce.number({ error: "scenarioId must be a whole number" }).int().positive().optional(),
  ...pagingFields,
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

/** The studies a list follows: ?ids=3,7,12 (1 to 100 study ids). */
export const studyIdsQuerySchema = z.object({
  ids: z
    .string({ error: "ids must list the studies to follow, e.g. 3,7,12" })
    .regex(/^\d{1,10}(,\d{1,10}){0,99}$/, { error: "ids must be 1 to 100 study ids separated by commas" })
    .transform((s) => [...new Set(s.split(",").map(Number))]),
});
