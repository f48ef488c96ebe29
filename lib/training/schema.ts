import { z } from "zod";
import { nameField, oneLineText } from "@/lib/http/text";

export const captionSchema = z.object({
  at: z.number({ error: "a time in seconds" }).finite().min(0).max(600),
  text: oneLineText("caption", 500).refine((v) => v.length > 0, "write the caption"),
});

export const itemSchema = z.object({
  runId: z.number().int().positive(),
  title: oneLineText("title", 200).optional().nullable(),
  captions: z.array(captionSchema).max(50).default([]),
});

export const sessionCreateSchema = z.object({
  title: oneLineText("title", 200).refine((v) => v.length > 0, "give the session a title"),
  description: z.string().trim().max(4000).optional().nullable(),
  items: z.array(itemSchema).max(30).optional(),
});

export const sessionUpdateSchema = z.object({
  version: z.number().int().min(0),
  title: nameField("title", 200).optional(),
  description: z.string().trim().max(4000).optional().nullable(),
  /** The whole ordered list (replaces the previous one). */
  items: z.array(itemSchema).max(30).optional(),
});

export const shareSchema = z
  .object({
    /** Extra people of the organisation to invite by e-mail (viewers are always told). */
    invite: z.array(z.email()).max(50).optional(),
  })
  // Unknown fields are refused: every field is optional, so a mistyped one would otherwise share silently.
  .strict();

export const viewSchema = z.object({
  itemId: z.number().int().positive(),
  watchedTo: z.number().finite().min(0).max(600),
  completed: z.boolean().optional(),
});
