import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { parseScenario } from "@/sim/schema";
import { designStatics } from "@/sim/statics";
import { applyOverrides, changedOverrides, overridableValues } from "@/lib/runs/overrides";
import { overrideLines } from "@/components/run/overridesText";

const file = JSON.parse(readFileSync(path.join(process.cwd(), "sim", "examples", "lift-hill-example.json"), "utf8"));
const parsed = parseScenario(file);
if (!parsed.ok) throw new Error("the example scenario must parse");
const base = parsed.scenario;

describe("what-if overrides", () => {
  it("replace only the fields they name", () => {
    const varied = applyOverrides(base, { takeUpMass: 7000 });
    expect(overridableValues(varied)).toEqual({ ...overridableValues(base), takeUpMass: 7000 });
    expect({ ...varied, takeUp: base.takeUp }).toEqual(base);
    // Source: statics of a 2:1 gravity take-up, each strand carries T = m·g/2 (any machine design text on gravity take-ups).
    expect(designStatics(varied).takeUpTension).toBeCloseTo((7000 * base.run.gravity) / 2, 6);
  });

  it("travel only when they differ from the scenario", () => {
    expect(changedOverrides(base, overridableValues(base))).toBeNull();
    expect(changedOverrides(base, { ...overridableValues(base), chainSpeed: 3 })).toEqual({ chainSpeed: 3 });
  });

  it("read in the user's units beside the scenario's value", () => {
    expect(overrideLines({ entrySpeed: 2.4 }, { entrySpeed: 1.8 }, "si")).toEqual(["entry speed 2.40 m/s (scenario: 1.80 m/s)"]);
    // Source: 1 ft = 0.3048 m and 1 lb = 0.45359237 kg exactly (international yard and pound, 1959).
    // 2.4 / 0.3048 = 7.874 ft/s, 1.8 / 0.3048 = 5.906 ft/s; 6000 / 0.45359237 = 13 227.7 lb.
    expect(overrideLines({ entrySpeed: 2.4, takeUpMass: 6000 }, { entrySpeed: 1.8, takeUpMass: 5000 }, "us")).toEqual([
      "entry speed 7.87 ft/s (scenario: 5.91 ft/s)",
      "take-up mass 13,228 lb (scenario: 11,023 lb)",
    ]);
    expect(overrideLines(null, null, "si")).toEqual([]);
  });
});
