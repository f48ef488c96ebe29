/** One zod schema per logbook concept, shared by the API, the forms and the tests. SI units. */
import { z } from "zod";
import { oneLineText } from "@/lib/http/text";
import { isoDateField } from "@/lib/http/dates";
import { queryId } from "@/lib/http/list-query";

const when = isoDateField("measuredAt").optional();
const notes = z.string().trim().max(2000).optional().nullable();
const metres = (max: number) => z.number({ error: "a number in metres" }).finite().min(0).max(max);

/** The date on its own: checked whatever the kind, so a bad date is named even when the kind is missing. */
export const entryDateSchema = z.object({ measuredAt: when });

export const entryInputSchema = z.discriminatedUnion("kind", [
  z.object({
    kind: z.literal("elongation"),
    liftId: z.number().int().positive(),
    measuredAt: when,
    notes,
    /** Length over `pitches` pitches, m. */
    measuredLength: metres(100).refine((v) => v > 0, "must be above 0"),
    pitches: z.number().int().min(2, "at least 2 pitches").max(1000),
    /** Nominal pitch, m (default: the lift's chain pitch). */
    nominalPitch: metres(0.5).refine((v) => v > 0, "must be above 0").optional(),
  }),
  z.object({
    kind: z.literal("take-up"),
    liftId: z.number().int().positive(),
    measuredAt: when,
    notes,
    /** Counterweight position at rest, m below the top stop. */
    position: metres(50),
  }),
  z.object({
    kind: z.literal("links-removed"),
    liftId: z.number().int().positive(),
    measuredAt: when,
    notes,
    links: z.number().int().min(1).max(500),
  }),
  z.object({
    kind: z.literal("lubrication"),
    liftId: z.number().int().positive(),
    measuredAt: when,
    notes,
    lubricant: oneLineText("lubricant", 200).optional(),
  }),
  z.object({
    kind: z.literal("inspection"),
    liftId: z.number().int().positive(),
    measuredAt: when,
    notes,
    findings: z.string().trim().min(1, "write what was found").max(5000),
    photoIds: z.array(z.number().int().positive()).max(12).optional(),
  }),
]);
export type EntryInput = z.infer<typeof entryInputSchema>;

export const settingsInputSchema = z
  .object({
    version: z.number().int().min(0),
    elongationLimit: z.number().finite().gt(0).max(20),
    elongationWarning: z.number().finite().gt(0).max(20),
    takeUpWarning: z.number().finite().gt(0).max(1),
    horizonDays: z.number().int().min(1).max(3650),
  })
  .refine((s) => s.elongationWarning <= s.elongationLimit, { path: ["elongationWarning"], message: "must not exceed the limit" });

export const entryListQuery = z.object({
  liftId: queryId("liftId"),
  kind: z.enum(["elongation", "take-up", "links-removed", "lubrication", "inspection"]).optional(),
  from: isoDateField("from").optional(),
  to: isoDateField("to").optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});

/** Defaults: replacement at 3 % elongation for roller chain (common practice, no source); warning at 2.5 %. */
export const DEFAULT_SETTINGS = { elongationLimit: 3, elongationWarning: 2.5, takeUpWarning: 0.8, horizonDays: 90 };

/** "Run with today's chain": the scenario of the lift to copy with the newest measured elongation. */
export const chainRunInputSchema = z
  .object({
    scenarioId: z
      .number({ error: "scenarioId must be an id (a whole number): choose a scenario of this lift" })
      .int({ error: "scenarioId must be a whole number" })
      .positive({ error: "scenarioId must be an id" }),
  })
  .strict();
