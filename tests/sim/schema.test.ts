import { describe, expect, it } from "vitest";
import example from "@/sim/examples/lift-hill-example.json";
import { parseScenario, scenarioSchema, trackLength } from "@/sim/schema";

const clone = () => JSON.parse(JSON.stringify(example)) as Record<string, Record<string, unknown>>;

describe("scenario schema", () => {
  it("accepts the example of the format and fills defaults", () => {
    const r = parseScenario(example);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.scenario.chain.damping).toBeGreaterThanOrEqual(0);
    expect(r.scenario.limits.requiredSafetyFactor).toBe(5);
    expect(r.scenario.run.integrator).toBe("verlet");
    // Source: geometry of the format: approach + R_sag·θ + incline + R_crest·θ + exit.
    const th = (40 * Math.PI) / 180;
    expect(trackLength(r.scenario.lift as Parameters<typeof trackLength>[0])).toBeCloseTo(15 + 30 * th + 50 + 25 * th + 40, 9);
  });

  it("lists every problem at once with dotted field paths", () => {
    const bad = clone();
    bad.chain.massPerLength = -1;
    delete bad.chain.pitch;
    bad.takeUp.position = 3; // beyond travel 2.5
    bad.lift.dogRelease = 5; // before chainFrom
    bad.antiRollback.to = 1000; // beyond the track
    bad.train.startPosition = -1;
    const r = parseScenario(bad);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const paths = r.issues.map((i) => i.path).sort();
    expect(paths).toEqual(
      ["antiRollback.to", "chain.massPerLength", "chain.pitch", "lift.dogRelease", "takeUp.position", "train.startPosition"].sort(),
    );
    for (const i of r.issues) expect(i.message).toContain(i.path);
  });

  it("rejects non-finite numbers, wrong format and a missing section", () => {
    const bad = clone();
    bad.format = "other/1" as never;
    (bad as Record<string, unknown>).run = undefined;
    bad.chain.axialStiffness = "1e7";
    const r = parseScenario(bad);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues.map((i) => i.path).sort()).toEqual(["chain.axialStiffness", "format", "run"]);
    expect(scenarioSchema.safeParse({ ...example, lift: { ...example.lift, chainTo: 200 } }).success).toBe(false);
  });
});
