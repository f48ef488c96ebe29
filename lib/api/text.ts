import { z } from "zod";

/** A required one-line name. */
export const nameField = (field = "name", max = 120) =>
  z
    .string({ error: `${field} must be text` })
    .trim()
    .min(1, { error: `${field} must not be empty` })
    .max(max, { error: `${field} must be at most ${max} characters` })
    // One-line names are shown in tables, logs and files: control characters (NUL, ESC, line breaks) are refused.
    .refine((v) => !CONTROL_CHARACTERS.test(v), { error: `${field} must not contain control characters` });

const CONTROL_CHARACTERS = /[\u0000-\u001f\u007f-\u009f]/;

/** Optional free text; empty text is stored as null. */
export const optionalText = (field: string, max: number) =>
  z
    .string({ error: `${field} must be text` })
    .trim()
    .max(max, { error: `${field} must be at most ${max} characters` })
    .nullish()
    .transform((v) => (v ? v : null));
