import { z } from "zod";
import {
  antiRollbackSchema,
  chainSchema,
  crossFieldIssues,
  driveSchema,
  liftSchema,
  limitsSchema,
  takeUpSchema,
} from "@/sim/schema";
import { nameField, optionalLine, optionalText } from "@/lib/http/text";
import { versionField } from "@/lib/http/version";

/**
 * What one lift revision holds: the engine's sections (same schemas as `sim/`, so a revision always
 * makes a valid scenario with a train) plus name/site/notes. `chain` holds the chain's values copied
 * from the catalogue entry `chainSpecId` (null for values typed in or imported).
 */
export const liftRevisionSchema = z
  .object({
    name: nameField("name"),
    site: optionalLine("site", 120),
    notes: optionalText("notes", 5000),
    chainSpecId: z.number().int().positive().nullable(),
    lift: liftSchema,
    chain: chainSchema,
    drive: driveSchema,
    takeUp: takeUpSchema,
    antiRollback: antiRollbackSchema,
    limits: limitsSchema,
  })
  .superRefine((r, ctx) => {
    // The scenario format's rules between fields of these sections (chain extent within the track, …).
    for (const i of crossFieldIssues(r)) ctx.addIssue({ code: "custom", path: i.path.split("."), message: i.message });
  });
export type LiftRevisionData = z.output<typeof liftRevisionSchema>;

export const SECTION_KEYS = ["lift", "chain", "drive", "takeUp", "antiRollback", "limits"] as const;
export type SectionKey = (typeof SECTION_KEYS)[number];

const sectionObject = (name: string) =>
  z.record(z.string(), z.unknown(), { error: `${name} must be an object (section "${name}")` });

/**
 * The chain as a lift takes it: either `chainSpecId` (the catalogue's pitch, mass per length, axial
 * stiffness and breaking strength are copied into the revision) or those four values typed in, plus
 * the routing (catchSpacing, catchOffset, guideFriction, damping).
 */
export const liftChainInputSchema = chainSchema.partial().extend({
  chainSpecId: z
    .number({ error: "chain.chainSpecId must be a catalogue chain id or null" })
    .int({ error: "chain.chainSpecId must be a whole number" })
    .positive({ error: "chain.chainSpecId must be a catalogue chain id" })
    .nullish(),
});

const envelope = {
  // Checked with the revision's own rules once merged with the current revision (see build.ts).
  name: z.unknown().optional(),
  site: z.unknown().optional(),
  notes: z.unknown().optional(),
  /** Why this revision was made; shown in the revision list. */
  changeSummary: optionalText("changeSummary", 500),
  lift: sectionObject("lift"),
  chain: sectionObject("chain"),
  drive: sectionObject("drive"),
  takeUp: sectionObject("takeUp"),
  antiRollback: sectionObject("antiRollback"),
  limits: sectionObject("limits"),
};

/** Body of POST /api/lifts: every section required except `limits` (defaults, see sim LIMIT_SOURCES). */
export const liftCreateBodySchema = z
  .object({ ...envelope, limits: envelope.limits.optional() })
  .strict();

/** Body of PATCH /api/lifts/[id]: the version edited plus any fields; a given section merges field by field. */
export const liftUpdateBodySchema = z
  .object({ version: versionField, ...envelope })
  .partial({
    name: true,
    site: true,
    notes: true,
    changeSummary: true,
    lift: true,
    chain: true,
    drive: true,
    takeUp: true,
    antiRollback: true,
    limits: true,
  })
  .strict();
