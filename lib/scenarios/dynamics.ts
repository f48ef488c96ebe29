/**
 * A scenario's drive model and damping (scenario format 2): the fields a scenario may set on top of its
 * pinned lift revision. Plain functions (no server imports), shared by the API, the editor and the seed.
 *
 * Stored as `scenarios.dynamics`, a partial of the engine's sections: what is absent comes from the
 * revision, and what the revision leaves out from the format's defaults (sim/schema.ts).
 */
import { z } from "zod";
import { chainSchema, contactsSchema, driveSchema, takeUpSchema } from "@/sim/schema";

/** Engine fields a scenario may set, by section. */
export const DYNAMICS_FIELDS = {
  drive: ["motor", "location", "stop", "restart"],
  chain: ["damping", "lossFactor", "elongation", "linksRemoved"],
  takeUp: ["friction", "damping"],
  contacts: ["dogStiffness", "ardStiffness", "dampingRatio"],
} as const;
export type DynamicsSection = keyof typeof DYNAMICS_FIELDS;
export const DYNAMICS_SECTIONS = Object.keys(DYNAMICS_FIELDS) as DynamicsSection[];

/** The field's own rule without its default or optional wrapper (a default would be stored as if set). */
export function withoutDefault(s: z.ZodType): z.ZodType {
  let cur = s as z.ZodType & { unwrap?: () => z.ZodType; removeDefault?: () => z.ZodType };
  while (cur instanceof z.ZodDefault || cur instanceof z.ZodOptional || cur instanceof z.ZodPrefault) {
    cur = (cur as unknown as { unwrap: () => z.ZodType }).unwrap() as typeof cur;
  }
  return cur;
}

const SECTION_SHAPES: Record<DynamicsSection, Record<string, z.ZodType>> = {
  drive: driveSchema.shape as unknown as Record<string, z.ZodType>,
  chain: chainSchema.shape as unknown as Record<string, z.ZodType>,
  takeUp: takeUpSchema.shape as unknown as Record<string, z.ZodType>,
  contacts: contactsSchema.shape as unknown as Record<string, z.ZodType>,
};

/** The rule of one engine field by its dotted path (e.g. "drive.motor"), unwrapped; undefined if not a dynamics field. */
export function dynamicsFieldSchema(path: string): z.ZodType | undefined {
  const [section, key] = path.split(".") as [DynamicsSection, string];
  if (!(section in DYNAMICS_FIELDS) || !(DYNAMICS_FIELDS[section] as readonly string[]).includes(key)) return undefined;
  const s = SECTION_SHAPES[section][key];
  return s ? withoutDefault(s) : undefined;
}

function sectionSchema(section: DynamicsSection) {
  const shape = Object.fromEntries(DYNAMICS_FIELDS[section].map((k) => [k, dynamicsFieldSchema(`${section}.${k}`)!.nullish()]));
  return z
    .strictObject(shape, {
      error: (iss) =>
        iss.code === "unrecognized_keys"
          ? `dynamics.${section} takes only ${DYNAMICS_FIELDS[section].join(", ")}`
          : `dynamics.${section} must be an object (section "${section}")`,
    })
    .optional();
}

/**
 * What the API takes as `dynamics`: only the fields above, each with the engine's own rule (its message
 * names the engine path and unit). A field set to null goes back to the revision's value or the default.
 */
export const dynamicsSchema = z
  .strictObject(
    Object.fromEntries(DYNAMICS_SECTIONS.map((s) => [s, sectionSchema(s)])) as Record<DynamicsSection, ReturnType<typeof sectionSchema>>,
    {
      error: (iss) =>
        iss.code === "unrecognized_keys"
          ? `dynamics takes only the sections ${DYNAMICS_SECTIONS.join(", ")}`
          : `dynamics must be an object with sections ${DYNAMICS_SECTIONS.join(", ")}`,
    },
  )
  .nullish();
export type Dynamics = Partial<Record<DynamicsSection, Record<string, unknown>>>;

const isObject = (v: unknown): v is Record<string, unknown> => !!v && typeof v === "object" && !Array.isArray(v);

/** Drops empty sections and undefined fields, so "nothing set" is stored as null. */
export function compactDynamics(d: unknown): Dynamics | null {
  if (!isObject(d)) return null;
  const out: Dynamics = {};
  for (const s of DYNAMICS_SECTIONS) {
    const sec = d[s];
    if (!isObject(sec)) continue;
    const kept = Object.fromEntries(Object.entries(sec).filter(([, v]) => v !== undefined && v !== null));
    if (Object.keys(kept).length) out[s] = kept;
  }
  return Object.keys(out).length ? out : null;
}

/** `patch` over `current`, section by section and field by field (null removes a field); null when nothing is left. */
export function mergeDynamics(current: unknown, patch: unknown): Dynamics | null {
  if (patch === null) return null;
  if (!isObject(patch)) return patch as Dynamics; // not an object: the schema refuses it with its path
  const base = compactDynamics(current) ?? {};
  const out: Record<string, unknown> = { ...base };
  for (const [s, sec] of Object.entries(patch)) {
    out[s] = isObject(sec) ? { ...(base[s as DynamicsSection] ?? {}), ...sec } : sec;
  }
  return out as Dynamics;
}

/** A section of the engine scenario: the revision's values with the scenario's dynamics over them. */
export function withDynamics(section: DynamicsSection, base: Record<string, unknown> | undefined, dynamics: Dynamics | null | undefined): Record<string, unknown> | undefined {
  const over = dynamics?.[section];
  if (!over) return base;
  return { ...(base ?? {}), ...over };
}

/** Whether an engine field path (e.g. "drive.motor.ratedSlip") is one the scenario's dynamics set. */
export function dynamicsPathSet(path: string, dynamics: Dynamics | null | undefined): boolean {
  const [section, key] = path.split(".");
  const sec = dynamics?.[section as DynamicsSection];
  return !!sec && key !== undefined && key in sec;
}
