import { z } from "zod";
import { runSettingsSchema, trainSchema } from "@/sim/schema";
import { LOADINGS } from "./loading";
import { nameField, optionalText } from "@/lib/http/text";
import { versionField } from "@/lib/http/version";

const id = (field: string) =>
  z
    .number({ error: `${field} must be an id (a whole number)` })
    .int({ error: `${field} must be a whole number` })
    .positive({ error: `${field} must be an id` });

/**
 * A scenario as the API takes it: a lift (pinned to `liftRevisionId`, default its current revision),
 * a train, a loading case, the entry conditions and the engine's run settings. SI units.
 */
export const scenarioInputSchema = z
  .object({
    name: nameField("name", 200),
    notes: optionalText("notes", 5000),
    liftId: id("liftId"),
    liftRevisionId: id("liftRevisionId").optional(),
    trainId: id("trainId"),
    loading: z.enum(LOADINGS, { error: `loading must be one of ${LOADINGS.join(", ")}` }),
    /** Riders in the whole train, only with loading "riders". */
    riderCount: z
      .number({ error: "riderCount must be a whole number" })
      .int({ error: "riderCount must be a whole number" })
      .min(0, { error: "riderCount must be at least 0" })
      .max(2000, { error: "riderCount must be at most 2000" })
      .nullish(),
    entrySpeed: trainSchema.shape.entrySpeed,
    startPosition: trainSchema.shape.startPosition,
    runSettings: runSettingsSchema,
  })
  .strict()
  .superRefine((s, ctx) => {
    if (s.loading === "riders" && (s.riderCount === null || s.riderCount === undefined))
      ctx.addIssue({ code: "custom", path: ["riderCount"], message: 'riderCount is required with loading "riders"' });
    if (s.loading !== "riders" && s.riderCount !== null && s.riderCount !== undefined)
      ctx.addIssue({ code: "custom", path: ["riderCount"], message: 'riderCount is only used with loading "riders"' });
  });
export type ScenarioInput = z.input<typeof scenarioInputSchema>;
export type ScenarioData = z.output<typeof scenarioInputSchema>;

/** PATCH body: the version edited plus any fields; `runSettings` merges field by field. */
export const scenarioUpdateSchema = z.object({ version: versionField }).loose();
