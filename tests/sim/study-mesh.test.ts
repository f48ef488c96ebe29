/**
 * A study's mesh choice on the engine: a case whose snatch factor still moves between 30 and 60 segments is run
 * finer, at a mesh where the check figures of the pair agree.
 */
import { describe, expect, it } from "vitest";
import { simulate } from "@/sim/simulate";
import { probeStudyMesh } from "@/lib/studies/mesh-choice";
import example from "@/sim/examples/lift-hill-example-v2.json";
import { parsed } from "./scenarios";

describe("the study's mesh choice on a real case", () => {
  // The example lift (induction drive) with the train entering at rest: the snatch factor depends on how finely
  // the chain is cut.
  const doc = structuredClone(example) as typeof example & { trains: { entrySpeed: number }[] };
  doc.trains[0].entrySpeed = 0;
  doc.run = { duration: 30, segments: 30 };
  const s = parsed(doc);
  const at = (n: number) => simulate(s, { segments: n, series: false, frameBudget: 0 }).summary;

  it("refines past 30 segments when 30 and 60 disagree, and runs the cases where a pair agrees", () => {
    const s30 = at(30);
    const s60 = at(60);
    const change = Math.abs(s60.snatchFactor! - s30.snatchFactor!) / s60.snatchFactor!;
    // Source: Roache, Verification and Validation in Computational Science and Engineering (systematic mesh
    // refinement): a figure that changes by more than the tolerance (2 %, assumption) on doubling is not converged.
    expect(change).toBeGreaterThan(0.02);
    const c = probeStudyMesh([s]);
    expect(c.segments).toBeGreaterThan(60);
    expect(c.settled).toBe(true);
    // The chosen mesh and its half agree on the check figures, measured here apart from the choice.
    const fine = at(c.segments);
    const coarse = at(c.segments / 2);
    for (const k of ["peakTension", "peakDriveTension", "snatchFactor"] as const) {
      const f = fine[k]!;
      expect(Math.abs(f - coarse[k]!) / Math.abs(f)).toBeLessThanOrEqual(0.02);
    }
    expect(c.reason).toBe(`Cases run at ${c.segments} segments: ${c.segments / 2} and ${c.segments} agreed within 2 % on the check figures.`);
  });
});
