/**
 * The lift form's validation in the browser: the engine's own section schemas and cross-field rules
 * (sim/schema.ts), assembled as lib/lifts/schema.ts assembles a revision, so the browser shows the
 * same messages the API answers with (and with the same dotted field paths).
 */
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
import { zodErrors } from "./form-model";

const name = z
  .string({ error: "name must be text" })
  .trim()
  .min(1, { error: "name must not be empty" })
  .max(120, { error: "name must be at most 120 characters" });
const text = (field: string, max: number) =>
  z.string({ error: `${field} must be text` }).trim().max(max, { error: `${field} must be at most ${max} characters` }).nullish();

export const liftFormSchema = z.object({
  name,
  site: text("site", 120),
  notes: text("notes", 5000),
  chainSpecId: z.number().int().positive().nullable(),
  lift: liftSchema,
  chain: chainSchema,
  drive: driveSchema,
  takeUp: takeUpSchema,
  antiRollback: antiRollbackSchema,
  limits: limitsSchema,
});

/** Every problem with the draft, by dotted path: field rules first, then the rules between fields. */
export function liftFormErrors(draft: unknown): Record<string, string> {
  const r = liftFormSchema.safeParse(draft);
  const errors = r.success ? {} : zodErrors(r.error.issues);
  for (const i of crossFieldIssues(draft)) if (!(i.path in errors)) errors[i.path] = i.message;
  return errors;
}
