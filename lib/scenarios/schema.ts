import { z } from "zod";
import { runSettingsSchema, trainSchema, trainSchemaV1 } from "@/sim/schema";
import { dynamicsSchema } from "./dynamics";
import { LOADINGS } from "./loading";
import { followerIssueMessage, followersSchema } from "./followers";
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
    entrySpeed: trainSchemaV1.shape.entrySpeed,
    startPosition: trainSchemaV1.shape.startPosition,
    /** s, when the train appears at its start position (format 2 `trains[0].startTime`). */
    startTime: trainSchema.shape.startTime,
    runSettings: runSettingsSchema,
    /** The scenario's drive model and damping over the pinned revision (lib/scenarios/dynamics.ts). */
    dynamics: dynamicsSchema,
    /** The trains after this one on the lift (format 2 `trains[1..n]`), each with its own train row. */
    followers: followersSchema,
  })
  .strict()
  .superRefine((s, ctx) => {
    if (s.loading === "riders" && (s.riderCount === null || s.riderCount === undefined))
      ctx.addIssue({ code: "custom", path: ["riderCount"], message: 'riderCount is required with loading "riders"' });
    if (s.loading !== "riders" && s.riderCount !== null && s.riderCount !== undefined)
      ctx.addIssue({ code: "custom", path: ["riderCount"], message: 'riderCount is only used with loading "riders"' });
  });
export type ScenarioInput = z.input<typeof scenarioInputSchema>;

/**
 * The lead train is trains[0]: the engine's message for any train ("trains.*.startTime …") says so; a
 * message about a following train (path followers.i…) names followers.i.
 */
export function scenarioIssueMessage(message: string, path?: string | readonly PropertyKey[]): string {
  const m = path === undefined ? message : followerIssueMessage(message, path);
  return m.replace(/trains\.\*\./g, "trains.0.");
}
export type ScenarioData = z.output<typeof scenarioInputSchema>;

/** PATCH body: the version edited plus any fields; `runSettings` and `dynamics` merge field by field. */
export const scenarioUpdateSchema = z.object({ version: versionField }).loose();
