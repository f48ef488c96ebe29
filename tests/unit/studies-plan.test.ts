import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import path from "node:path";
import { parseScenario } from "@/sim/schema";
import { planStudy, type StudyPlanInput } from "@/lib/studies/plan";
import { createStudySchema } from "@/lib/studies/schema";
import { HttpError } from "@/lib/http/errors";

const file = JSON.parse(readFileSync(path.join(process.cwd(), "sim", "examples", "lift-hill-example.json"), "utf8"));
const parsed = parseScenario(file);
if (!parsed.ok) throw new Error("the example scenario does not validate");
const base = parsed.scenario;
const train = { carMassEmpty: 1000, seatsPerCar: 4, riderMass: 75 };
// An invented catalogue chain of this organisation (7), and one of another organisation (8).
const chainRows = [
  { id: 7, organisationId: 1, designation: "TL-80 test", pitch: 0.1016, massPerLength: 8.2, axialStiffness: 2.1e7, breakingStrength: 5.6e5 },
  { id: 8, organisationId: 2, designation: "Other org", pitch: 0.1016, massPerLength: 8.2, axialStiffness: 2.1e7, breakingStrength: 5.6e5 },
];

function input(raw: unknown, defaults: Partial<StudyPlanInput> = {}): StudyPlanInput {
  return { body: createStudySchema.parse(raw), organisationId: 1, base, train, chainRows, defaultBudgetSeconds: 120, ...defaults };
}

function refusal(fn: () => unknown): HttpError {
  try {
    fn();
  } catch (err) {
    if (err instanceof HttpError) return err;
    throw err;
  }
  throw new Error("expected a refusal");
}

describe("planning a study before anything is stored", () => {
  it("makes every combination, the first parameter varying slowest, with the default budget", () => {
    const plan = planStudy(input({ scenarioId: 1, name: "grid", parameters: [{ key: "entrySpeed", values: [1, 2] }, { key: "loading", values: ["empty", "full"] }] }));
    expect(plan.grid).toEqual([
      { entrySpeed: 1, loading: "empty" },
      { entrySpeed: 1, loading: "full" },
      { entrySpeed: 2, loading: "empty" },
      { entrySpeed: 2, loading: "full" },
    ]);
    expect(plan.stored.solver).toEqual({ budgetSeconds: 120 });
    expect(plan.stored.requireNoArdCatch).toBe(true);
    expect(plan.stored.train).toEqual(train);
  });

  it("keeps the chains it names, in order, and refuses another organisation's chain on the parameter's path", () => {
    const plan = planStudy(input({ scenarioId: 1, name: "chains", parameters: [{ key: "chainSpec", values: [7] }], settings: { budgetSeconds: 30, frameBudget: 50 } }));
    expect(plan.stored.chains.map((c) => c.designation)).toEqual(["TL-80 test"]);
    expect(plan.stored.solver).toEqual({ budgetSeconds: 30, frameBudget: 50 });
    const err = refusal(() => planStudy(input({ scenarioId: 1, name: "foreign", parameters: [{ key: "chainSpec", values: [8] }] })));
    expect(err.status).toBe(400);
    expect(err.issues[0]).toEqual({ path: "parameters.0.values", message: "chain 8 is not in the catalogue" });
  });

  it("refuses more than 400 cases, and cases the engine would not accept, naming the case", () => {
    const big = refusal(() =>
      planStudy(input({ scenarioId: 1, name: "big", parameters: [{ key: "entrySpeed", range: { from: 0, to: 20, step: 0.5 } }, { key: "takeUpMass", range: { from: 1000, to: 11000, step: 1000 } }] })),
    );
    // 41 entry speeds × 11 masses = 451 cases.
    expect(big.issues[0].message).toBe("451 cases is more than 400");
    const bad = refusal(() => planStudy(input({ scenarioId: 1, name: "bad", parameters: [{ key: "chainSpeed", values: [1, 50] }] })));
    // A 50 m/s chain is outside the engine's drive speed bounds (sim/schema.ts); 1 m/s is inside.
    expect(bad.issues.length).toBeGreaterThan(0);
    expect(bad.issues.every((i) => i.path.startsWith("cases.1.drive.speed"))).toBe(true);
  });
});
