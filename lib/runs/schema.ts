import { z } from "zod";
import { driveSchema, runSettingsSchema, takeUpSchema, trainSchemaV1 } from "@/sim/schema";
import { RUN_STATUSES } from "./status";
import { pagingFields } from "@/lib/http/list-query";

const run = runSettingsSchema.shape;

export const RUN_OVERRIDE_KEYS = ["entrySpeed", "chainSpeed", "takeUpMass"] as const;

/**
 * What-if values a run may put in place of its scenario's (SI): the run view's sliders. The bounds are the
 * scenario format's own fields (train.entrySpeed, drive.speed, takeUp.mass), so a saved what-if can never
 * hold a value the scenario itself could not.
 */
export const runOverridesSchema = z
  .object(
    {
      entrySpeed: trainSchemaV1.shape.entrySpeed.unwrap().optional(),
      chainSpeed: driveSchema.shape.speed.optional(),
      takeUpMass: takeUpSchema.shape.mass.optional(),
    },
    {
      error: (iss) =>
        iss.code === "unrecognized_keys"
          ? `overrides takes only ${RUN_OVERRIDE_KEYS.join(", ")} (not ${iss.keys.join(", ")})`
          : `overrides must be an object of ${RUN_OVERRIDE_KEYS.join(", ")}`,
    },
  )
  .strict();

export type RunOverrides = z.output<typeof runOverridesSchema>;
export type RunOverrideKey = (typeof RUN_OVERRIDE_KEYS)[number];

/**
 * Solver settings a run may override on top of its scenario's `run` section. The bounds are the
 * engine's own (sim/schema.ts); `frameBudget` and `budgetSeconds` go to simulate() as options.
 */
export const startRunSchema = z
  .object({
    duration: run.duration.optional(),
    segments: run.segments.unwrap().optional(),
    integrator: run.integrator.unwrap().optional(),
    stepFraction: run.stepFraction.unwrap().optional(),
    tolerance: run.tolerance.unwrap().optional(),
    frameBudget: z
      .number({ error: "frameBudget must be a whole number of frames" })
      .int({ error: "frameBudget must be a whole number of frames" })
      .min(10, { error: "frameBudget must be at least 10 (frames)" })
      .max(5000, { error: "frameBudget must be at most 5000 (frames)" })
      .optional(),
    budgetSeconds: z
      .number({ error: "budgetSeconds must be a number (s)" })
      .gt(0, { error: "budgetSeconds must be greater than 0 (s)" })
      .max(600, { error: "budgetSeconds must be at most 600 (s)" })
      .optional(),
    overrides: runOverridesSchema.optional(),
  })
  .strict();

export type StartRunInput = z.output<typeof startRunSchema>;

/** Overrides that belong to the scenario's `run` section (the rest are simulate() options). */
export const RUN_SECTION_OVERRIDES = ["duration", "segments", "integrator", "stepFraction", "tolerance"] as const;

export const listRunsQuerySchema = z.object({
  ...pagingFields,
  status: z.enum(RUN_STATUSES, { error: `status must be one of ${RUN_STATUSES.join(", ")}` }).optional(),
  sort: z.enum(["newest", "oldest"], { error: "sort must be newest or oldest" }).default("newest"),
  /** own: the scenario's own runs (what-if runs included); study: cases of its studies; all: both. */
  source: z.enum(["own", "study", "all"], { error: "source must be own, study or all" }).default("all"),
});

export type ListRunsQuery = z.output<typeof listRunsQuerySchema>;

export const resultQuerySchema = z.object({
  format: z.enum(["json", "binary"], { error: "format must be json or binary" }).optional(),
});
