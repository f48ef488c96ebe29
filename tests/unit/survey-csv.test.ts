import { describe, expect, it } from "vitest";
import { readSurveyCsv } from "@/lib/lifts/survey-csv";
import { FOOT } from "@/sim/units";

describe("survey points from CSV", () => {
  it("reads a header, semicolons with decimal commas, and converts feet", () => {
    const r = readSurveyCsv("distance;height\n0;0\n1,5;0,25\n3;1\n", "si");
    expect(r.issues).toEqual([]);
    expect(r.decimalComma).toBe(true);
    expect(r.points).toEqual([{ x: 0, z: 0 }, { x: 1.5, z: 0.25 }, { x: 3, z: 1 }]);
    // Source: 1 ft = 0.3048 m exactly (international yard and pound, 1959).
    const ft = readSurveyCsv("0,0\n10,2\n20,4\n", "us");
    expect(ft.decimalComma).toBe(false);
    expect(ft.points[1].x).toBeCloseTo(10 * FOOT, 12);
    expect(FOOT).toBe(0.3048);
  });

  it("names the line of a bad cell and returns no points", () => {
    // Source: common practice, no source (a bad row is named, nothing is half-read).
    const r = readSurveyCsv("x,z\n0,0\n1,abc\n2,1\n", "si");
    expect(r.points).toEqual([]);
    expect(r.issues).toEqual(['line 3: height "abc" is not a number']);
  });
});
