import { describe, expect, it } from "vitest";
import { createStudySchema, expandGrid, parameterValues, type StudyParameter } from "@/lib/studies/schema";
import { operatingWindow } from "@/lib/studies/window";
import { caseScenario } from "@/lib/studies/cases";
import { parseScenario } from "@/sim/schema";
import { readFileSync } from "node:fs";
import path from "node:path";

const speed: StudyParameter = { key: "entrySpeed", range: { from: 2.4, to: 3.2, step: 0.1 } };
const loading: StudyParameter = { key: "loading", values: ["empty", "full"] };

describe("grids", () => {
  it("includes both ends of a range without float drift", () => {
    // Source: arithmetic, 2.4 + 8 × 0.1 = 3.2 (nine values).
    expect(parameterValues(speed)).toEqual([2.4, 2.5, 2.6, 2.7, 2.8, 2.9, 3, 3.1, 3.2]);
  });
  it("varies the first parameter slowest", () => {
    const g = expandGrid([loading, { key: "takeUpMass", values: [4000, 5000] }]);
    expect(g).toEqual([
      { loading: "empty", takeUpMass: 4000 },
      { loading: "empty", takeUpMass: 5000 },
      { loading: "full", takeUpMass: 4000 },
      { loading: "full", takeUpMass: 5000 },
    ]);
  });
  it("refuses a range and a list together, and the same parameter twice", () => {
    const a = createStudySchema.safeParse({ scenarioId: 1, name: "x", parameters: [{ key: "entrySpeed", range: { from: 1, to: 2, step: 1 }, values: [1] }] });
    expect(a.success).toBe(false);
    const b = createStudySchema.safeParse({ scenarioId: 1, name: "x", parameters: [loading, loading] });
    expect(b.success).toBe(false);
  });
});

describe("the operating window", () => {
  // Acceptable speeds (a hand-made answer): full 2.6–3.1, empty 2.4–3.0 — in the form of README's operating-window example.
  const ok = (l: string, v: number) => (l === "full" ? v >= 2.6 && v <= 3.1 : v >= 2.4 && v <= 3.0);
  const cases = expandGrid([speed, loading]).map((values) => ({
    values,
    status: "done",
    acceptable: ok(String(values.loading), Number(values.entrySpeed)),
  }));

  it("is stated in words and numbers per loading", () => {
    const w = operatingWindow([speed, loading], cases);
    // Source: the hand-made answer above, in the wording of README "Design studies" ("Entry speed … m/s with the … train").
    expect(w.text).toBe("Entry speed 2.40–3.00 m/s with the empty train; entry speed 2.60–3.10 m/s with the full train.");
    expect(w.groups.find((g) => g.group?.value === "full")!.intervals).toEqual([[2.6, 3.1]]);
    expect(w.incomplete).toBe(false);
  });

  it("splits at an unacceptable or unfinished case and converts to US units", () => {
    const holes = cases.map((c) => (c.values.entrySpeed === 2.8 ? { ...c, status: "failed", acceptable: null } : c));
    const w = operatingWindow([speed, loading], holes, { units: "us" });
    expect(w.groups.find((g) => g.group?.value === "empty")!.intervals).toEqual([[2.4, 2.7], [2.9, 3.0]]);
    expect(w.incomplete).toBe(true);
    // Source: 1 ft = 0.3048 m exactly (NIST SP 811): 2.4 m/s = 7.87 ft/s.
    expect(w.text).toContain("7.87–8.86 ft/s");
  });

  it("lists acceptable combinations when nothing is numeric", () => {
    const chain: StudyParameter = { key: "chainSpec", values: [3, 5] };
    const w = operatingWindow([chain, loading], [
      { values: { chainSpec: 3, loading: "empty" }, status: "done", acceptable: true },
      { values: { chainSpec: 3, loading: "full" }, status: "done", acceptable: false },
      { values: { chainSpec: 5, loading: "empty" }, status: "done", acceptable: true },
      { values: { chainSpec: 5, loading: "full" }, status: "done", acceptable: true },
    ]);
    expect(w.axis).toBeNull();
    expect(w.combos).toHaveLength(3);
  });
});

describe("case scenarios", () => {
  const file = JSON.parse(readFileSync(path.join(process.cwd(), "sim", "examples", "lift-hill-example.json"), "utf8"));
  const base = parseScenario(file);
  it("puts each parameter into the engine's field", () => {
    if (!base.ok) throw new Error("example does not validate");
    const chains = new Map([[9, { id: 9, designation: "No. 120", pitch: 0.0381, massPerLength: 8.9, axialStiffness: 4e7, breakingStrength: 1.5e6 }]]);
    const r = caseScenario(base.scenario, { entrySpeed: 3, chainSpeed: 2, takeUpMass: 6000, chainSpec: 9, loading: "part" }, { chains, train: { carMassEmpty: 1000, seatsPerCar: 4, riderMass: 75 } });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.scenario.trains[0]!.entrySpeed).toBe(3);
    expect(r.scenario.drive.speed).toBe(2);
    expect(r.scenario.takeUp.mass).toBe(6000);
    expect(r.scenario.chain.pitch).toBe(0.0381);
    // Part-loaded = half the seats (the study's own assumption): 1000 + 2 × 75.
    expect(r.scenario.trains[0]!.carMass).toBe(1150);
    expect(base.scenario.trains[0]!.entrySpeed).toBe(2.2); // the base is not changed
  });
});
