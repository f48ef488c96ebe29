/**
 * The trains that follow a scenario's lead train on the lift (format 2 `trains[1..n]`): each its own train
 * row with a loading case and entry conditions. Plain functions (no server imports), shared by the API, the
 * editor, the seed and the engine builder. SI units.
 */
import { z } from "zod";
import { MAX_TRAINS, trainSchema } from "@/sim/schema";
import { LOADINGS } from "./loading";

const F = "followers.*";

/** One following train. "*" in a message stands for its index (followerIssueMessage puts the real one in). */
export const followerSchema = z
  .strictObject(
    {
      trainId: z
        .number({ error: `${F}.trainId must be an id (a whole number)` })
        .int({ error: `${F}.trainId must be a whole number` })
        .positive({ error: `${F}.trainId must be an id` }),
      loading: z.enum(LOADINGS, { error: `${F}.loading must be one of ${LOADINGS.join(", ")}` }),
      /** Riders in the whole train, only with loading "riders". */
      riderCount: z
        .number({ error: `${F}.riderCount must be a whole number` })
        .int({ error: `${F}.riderCount must be a whole number` })
        .min(0, { error: `${F}.riderCount must be at least 0` })
        .max(2000, { error: `${F}.riderCount must be at most 2000` })
        .nullish(),
      /** m/s, the train's speed as it appears. */
      entrySpeed: trainSchema.shape.entrySpeed,
      /** m, arc position of the train's front when it appears. */
      startPosition: trainSchema.shape.startPosition,
      /** s, when the train appears at its start position. */
      startTime: trainSchema.shape.startTime,
    },
    {
      error: (iss) =>
        iss.code === "unrecognized_keys"
          ? `${F} takes only trainId, loading, riderCount, entrySpeed, startPosition, startTime`
          : `${F} must be an object (a following train)`,
    },
  )
  .superRefine((f, ctx) => {
    if (f.loading === "riders" && (f.riderCount === null || f.riderCount === undefined))
      ctx.addIssue({ code: "custom", path: ["riderCount"], message: `${F}.riderCount is required with loading "riders"` });
    if (f.loading !== "riders" && f.riderCount !== null && f.riderCount !== undefined)
      ctx.addIssue({ code: "custom", path: ["riderCount"], message: `${F}.riderCount is only used with loading "riders"` });
  });

export const MAX_FOLLOWERS = MAX_TRAINS - 1;

/** The list as the API takes it; absent or null = the lead train alone. */
export const followersSchema = z
  .array(followerSchema, { error: "followers must be a list of following trains" })
  .max(MAX_FOLLOWERS, { error: `followers must list at most ${MAX_FOLLOWERS} trains (the lead train makes ${MAX_TRAINS})` })
  .nullish();

export type ScenarioFollower = z.output<typeof followerSchema>;
export type ScenarioFollowerInput = z.input<typeof followerSchema>;

/** A message about followers[i] with its index in place of "*" (`path` is the issue's path). */
export function followerIssueMessage(message: string, path: string | readonly PropertyKey[]): string {
  const parts = typeof path === "string" ? path.split(".") : path.map(String);
  if (parts[0] !== "followers" || parts[1] === undefined || !/^\d+$/.test(parts[1])) return message;
  // The followers' entry fields share the engine's rules, whose messages say "trains.*.".
  return message.replace(/(followers|trains)\.\*/g, `followers.${parts[1]}`);
}

/** Stored form: the list with riderCount only where it counts; null when there are none. */
export function compactFollowers(list: readonly ScenarioFollower[] | null | undefined): ScenarioFollower[] | null {
  if (!list || !list.length) return null;
  return list.map((f) => ({
    trainId: f.trainId,
    loading: f.loading,
    riderCount: f.loading === "riders" ? (f.riderCount ?? 0) : null,
    entrySpeed: f.entrySpeed,
    startPosition: f.startPosition,
    startTime: f.startTime ?? 0,
  }));
}

/**
 * An engine path about trains[j] in the scenario's own words: trains.0 is the lead train (the scenario's
 * entry fields), trains.j (j ≥ 1) is followers.(j − 1).
 */
export function followerPathOf(enginePath: string): string | null {
  const m = /^trains\.(\d+)(\..*)?$/.exec(enginePath);
  if (!m || m[1] === "0") return null;
  return `followers.${Number(m[1]) - 1}${m[2] ?? ""}`;
}

/** The engine's message with trains.j rewritten the same way (trains.0 = "the lead train"). */
export function followerMessage(message: string): string {
  return message.replace(/trains\.(\d+)/g, (_, j: string) => (j === "0" ? "the lead train" : `followers.${Number(j) - 1}`));
}

/** The stored column as a list (a JSON column may come back as text from some drivers). */
export function storedFollowers(v: unknown): ScenarioFollower[] {
  const list = typeof v === "string" ? (JSON.parse(v) as unknown) : v;
  return Array.isArray(list) ? (list as ScenarioFollower[]) : [];
}
