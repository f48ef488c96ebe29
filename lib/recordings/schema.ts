/** The logger-upload request: the CSV text, which column is which, and the units they are in. */
import { z } from "zod";
import { nameField, oneLineText } from "@/lib/http/text";

export const CHANNELS = ["takeUpPosition", "chainTension", "driveCurrent", "trainPosition", "trainSpeed"] as const;
export type Channel = (typeof CHANNELS)[number];

export const CHANNEL_LABELS: Record<Channel | "time", string> = {
  time: "Time",
  takeUpPosition: "Take-up position",
  chainTension: "Chain tension",
  driveCurrent: "Drive current",
  trainPosition: "Train position",
  trainSpeed: "Train speed",
};

const column = z.string().trim().min(1).max(120);

export const mappingSchema = z
  .object({
    time: column,
    takeUpPosition: column.optional(),
    chainTension: column.optional(),
    driveCurrent: column.optional(),
    trainPosition: column.optional(),
    trainSpeed: column.optional(),
  })
  .refine((m) => CHANNELS.some((c) => m[c]), { message: "map at least one of take-up position, chain tension, drive current, train position or speed", path: ["takeUpPosition"] });

const timeUnit = z.enum(["s", "ms"]);
const lengthUnit = z.enum(["m", "cm", "mm", "in", "ft"]);
const forceUnit = z.enum(["N", "kN", "lbf", "kip"]);
const speedUnit = z.enum(["m/s", "km/h", "ft/s", "mph"]);

/**
 * File-wide units per quantity. Each is optional: a unit written in a column's header (`[ms]`, `(kN)`)
 * is read first (lib/recordings/headers.ts); these apply to columns whose header states none.
 */
export const unitsSchema = z.object({
  time: timeUnit.optional(),
  length: lengthUnit.optional(),
  force: forceUnit.optional(),
  speed: speedUnit.optional(),
  /** Which way the logger's take-up reading grows: "down" = the counterweight dropping (our convention). */
  takeUpDirection: z.enum(["down", "up"]).default("down"),
});
export type Units = z.infer<typeof unitsSchema>;

export const recordingInputSchema = z.object({
  liftId: z.number().int().positive(),
  name: nameField("name", 200),
  fileName: oneLineText("fileName", 200).optional(),
  csv: z.string().min(1, "the file is empty"),
  mapping: mappingSchema,
  units: unitsSchema.default({ takeUpDirection: "down" }),
  /** The unit of each mapped column as corrected in the mapping step; wins over the header and `units`. */
  columnUnits: z.partialRecord(z.enum(["time", ...CHANNELS]), z.string().trim().max(20)).optional(),
  /** Engagement (dog picks up the train) in recording time, s; detected from the train speed when left out. */
  engagementTime: z.number({ error: "engagementTime must be a number of seconds" }).finite().min(0).max(1e11, { error: "engagementTime must be within the recording" }).optional(),
  dryRun: z.boolean().optional(),
});
export type RecordingInput = z.infer<typeof recordingInputSchema>;

export const RECORDING_MAX_BYTES = Number(process.env.RECORDING_MAX_BYTES ?? 2 * 1024 * 1024);
export const RECORDING_MAX_ROWS = 50_000;

// Exact definitions: inch 0.0254 m, foot 0.3048 m, pound-force 4.4482216152605 N (kip = 1000 lbf), mile 1609.344 m.
export const FACTORS = {
  time: { s: 1, ms: 1e-3 },
  length: { m: 1, cm: 1e-2, mm: 1e-3, in: 0.0254, ft: 0.3048 },
  force: { N: 1, kN: 1e3, lbf: 4.4482216152605, kip: 4448.2216152605 },
  speed: { "m/s": 1, "km/h": 1 / 3.6, "ft/s": 0.3048, mph: 1609.344 / 3600 },
} as const;
