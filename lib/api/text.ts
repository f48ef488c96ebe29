import { z } from "zod";

/** A required one-line name. */
export const nameField = (field = "name", max = 120) =>
  z
    .string({ error: `${field} must be text` })
    .trim()
    .min(1, { error: `${field} must not be empty` })
    .max(max, { error: `${field} must be at most ${max} characters` });

/** Optional free text; empty text is stored as null. */
export const optionalText = (field: string, max: number) =>
  z
    .string({ error: `${field} must be text` })
    .trim()
    .max(max, { error: `${field} must be at most ${max} characters` })
    .nullish()
    .transform((v) => (v ? v : null));
