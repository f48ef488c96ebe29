import { z } from "zod";
import { nameField } from "@/lib/http/text";
import { startRunSchema } from "@/lib/runs/schema";

/**
 * What a study may vary. Numbers are SI (m/s, kg, s). `chainSpec` takes catalogue ids, `loading` the
 * train's loading cases, `dispatchInterval` the time between trains on the lift (lib/studies/cases.ts adds
 * the following train). Plain values only: screens import this file too.
 */
export const STUDY_PARAMETER_KEYS = ["entrySpeed", "chainSpeed", "takeUpMass", "dispatchInterval", "chainSpec", "loading"] as const;
export type StudyParameterKey = (typeof STUDY_PARAMETER_KEYS)[number];

export const NUMERIC_PARAMETERS = ["entrySpeed", "chainSpeed", "takeUpMass", "dispatchInterval"] as const;
export type NumericParameterKey = (typeof NUMERIC_PARAMETERS)[number];

export const STUDY_LOADINGS = ["empty", "part", "full"] as const;
export type StudyLoading = (typeof STUDY_LOADINGS)[number];
/** Share of the seats taken for each loading case ("part" = half the seats: an assumption). */
export const LOADING_FRACTION: Record<StudyLoading, number> = { empty: 0, part: 0.5, full: 1 };

export const PARAMETER_LABELS: Record<StudyParameterKey, { label: string; quantity: "speed" | "mass" | "time" | null }> = {
  entrySpeed: { label: "Entry speed", quantity: "speed" },
  chainSpeed: { label: "Chain speed", quantity: "speed" },
  takeUpMass: { label: "Take-up mass", quantity: "mass" },
  dispatchInterval: { label: "Dispatch interval", quantity: "time" },
  chainSpec: { label: "Chain", quantity: null },
  loading: { label: "Train loading", quantity: null },
};

/**
 * Bounds of the dispatch interval, s (assumption): below 5 s no lift dispatches a second train, and past 300 s
 * the two trains no longer meet on the lift; a case's own lower bound (the train clearing its length at chain
 * speed) is checked in lib/studies/cases.ts.
 */
export const DISPATCH_INTERVAL_BOUNDS = { min: 5, max: 300 } as const;

/** Most cases one study may hold. */
export const MAX_STUDY_CASES = 400;

const num = (what: string) => z.number({ error: `${what} must be a number` });

const rangeSchema = z
  .object({
    from: num("from").min(0, { error: "from must be at least 0" }),
    to: num("to").min(0, { error: "to must be at least 0" }),
    step: num("step").gt(0, { error: "step must be greater than 0" }),
  })
  .strict()
  .refine((r) => r.to >= r.from, { error: "to must not be below from", path: ["to"] })
  .refine((r) => (r.to - r.from) / r.step <= MAX_STUDY_CASES, { error: `the range has more than ${MAX_STUDY_CASES} values`, path: ["step"] });

const numericParameter = z
  .object({
    key: z.enum(NUMERIC_PARAMETERS, { error: `key must be one of ${STUDY_PARAMETER_KEYS.join(", ")}` }),
    range: rangeSchema.optional(),
    values: z.array(num("each value").min(0, { error: "values must be at least 0" })).min(1).max(MAX_STUDY_CASES).optional(),
  })
  .strict()
  .refine((p) => (p.range ? 1 : 0) + (p.values ? 1 : 0) === 1, { error: "give either range or values", path: ["values"] })
  .superRefine((p, ctx) => {
    if (p.key !== "dispatchInterval") return;
    const { min, max } = DISPATCH_INTERVAL_BOUNDS;
    const check = (v: number, path: (string | number)[]) => {
      if (v < min) ctx.addIssue({ code: "custom", path, message: `Dispatch interval must be at least ${min} s` });
      else if (v > max) ctx.addIssue({ code: "custom", path, message: `Dispatch interval must be at most ${max} s` });
    };
    if (p.range) {
      check(p.range.from, ["range", "from"]);
      check(p.range.to, ["range", "to"]);
    }
    p.values?.forEach((v, i) => check(v, ["values", i]));
  });

const chainParameter = z
  .object({
    key: z.literal("chainSpec"),
    values: z
      .array(z.number({ error: "chain ids must be whole numbers" }).int({ error: "chain ids must be whole numbers" }).positive())
      .min(1, { error: "pick at least one chain" })
      .max(50),
  })
  .strict();

const loadingParameter = z
  .object({
    key: z.literal("loading"),
    values: z
      .array(z.enum(STUDY_LOADINGS, { error: `loading must be one of ${STUDY_LOADINGS.join(", ")}` }))
      .min(1, { error: "pick at least one loading" })
      .max(3),
  })
  .strict();

export const studyParameterSchema = z.union([chainParameter, loadingParameter, numericParameter], {
  error: `key must be one of ${STUDY_PARAMETER_KEYS.join(", ")}`,
});
export type StudyParameter = z.output<typeof studyParameterSchema>;

/** Solver settings for every case (the run overrides) and what counts as acceptable. */
export const studySettingsSchema = startRunSchema
  // A study varies its parameters itself; the run view's what-if values are not study settings.
  .omit({ overrides: true })
  .extend({
    /** When true (default), any settle-back onto the ARD makes a case unacceptable. */
    requireNoArdCatch: z.boolean({ error: "requireNoArdCatch must be true or false" }).default(true),
  })
  .strict();
export type StudySettings = z.output<typeof studySettingsSchema>;

export const createStudySchema = z
  .object({
    scenarioId: z.number({ error: "scenarioId must be a whole number" }).int().positive(),
    name: nameField("name", 200),
    parameters: z
      .array(studyParameterSchema)
      .min(1, { error: "vary one or two parameters" })
      .max(2, { error: "vary one or two parameters" })
      .refine((ps) => ps.length < 2 || ps[0].key !== ps[1].key, { error: "the two parameters must differ", path: [1, "key"] }),
    settings: studySettingsSchema.default(() => studySettingsSchema.parse({})),
  })
  .strict();
export type CreateStudyInput = z.output<typeof createStudySchema>;

/** The values one parameter takes, in order (ranges inclusive of `to`, rounded against float drift). */
export function parameterValues(p: StudyParameter): (number | string)[] {
  if (p.key === "chainSpec" || p.key === "loading") return [...p.values];
  if (p.values) return [...p.values];
  const r = p.range!;
  const n = Math.floor((r.to - r.from) / r.step + 1e-9);
  const out: number[] = [];
  for (let i = 0; i <= n; i++) out.push(Number((r.from + i * r.step).toPrecision(12)));
  return out;
}

/** Every combination, the first parameter varying slowest. */
export function expandGrid(parameters: StudyParameter[]): Record<string, number | string>[] {
  let cases: Record<string, number | string>[] = [{}];
  for (const p of parameters) {
    const vals = parameterValues(p);
    cases = cases.flatMap((c) => vals.map((v) => ({ ...c, [p.key]: v })));
  }
  return cases;
}
