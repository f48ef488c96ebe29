import { z } from "zod";
import { chainSchema } from "@/sim/schema";
import { nameField, optionalText } from "@/lib/http/text";

/** The physical values a catalogue entry holds: the same field rules as the engine's chain section. */
export const CHAIN_VALUE_FIELDS = ["pitch", "massPerLength", "axialStiffness", "breakingStrength"] as const;
export type ChainValueField = (typeof CHAIN_VALUE_FIELDS)[number];

export const chainSpecInputSchema = z
  .object({
    designation: nameField("designation"),
    ...chainSchema.pick({ pitch: true, massPerLength: true, axialStiffness: true, breakingStrength: true }).shape,
    source: nameField("source", 500),
    note: optionalText("note", 2000),
  })
  .strict();

export type ChainSpecInput = z.input<typeof chainSpecInputSchema>;
