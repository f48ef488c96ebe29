import { describe, expect, it } from "vitest";
import { diffRevisions } from "@/lib/lifts/diff";
import { diffValues } from "@/lib/diff/values";

describe("revision diff", () => {
  it("lists changed leaves by dotted path, in field order, and nothing for equal values", () => {
    const a = { name: "Lift A", lift: { angle: 40, chainTo: 122 }, drive: { speed: 2.5 }, chainSpecId: 3 };
    const b = { name: "Lift A", lift: { angle: 38, chainTo: 122 }, drive: { speed: 2.5, rampTime: 2 }, chainSpecId: null };
    expect(diffRevisions(a, b)).toEqual([
      { path: "chainSpecId", before: 3, after: null },
      { path: "lift.angle", before: 40, after: 38 },
      { path: "drive.rampTime", before: null, after: 2 },
    ]);
    expect(diffRevisions(a, structuredClone(a))).toEqual([]);
  });

  it("compares arrays and dates whole and handles a missing side", () => {
    expect(diffValues({ x: [1, 2] }, { x: [1, 3] })).toEqual([{ path: "x", before: [1, 2], after: [1, 3] }]);
    expect(diffValues(undefined, { y: 1 })).toEqual([{ path: "(value)", before: null, after: { y: 1 } }]);
    expect(diffValues({ at: new Date(0) }, { at: new Date(0) })).toEqual([]);
  });
});
