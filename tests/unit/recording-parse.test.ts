import { describe, expect, it } from "vitest";
import { detectEngagement, parseRecordingCsv, readHeaders } from "@/lib/recordings/parse";
import { unitsSchema } from "@/lib/recordings/schema";

const units = unitsSchema.parse({ length: "mm", speed: "km/h" });

describe("logger CSV", () => {
  it("lists every problem with its line and column, and keeps no samples", () => {
    const csv = ["t,takeup,speed", "0,10,0", "0.1,abc,0", "0.1,11,0", "0.3,12", "0.4,13,x"].join("\n");
    const r = parseRecordingCsv(csv, { time: "t", takeUpPosition: "takeup", trainSpeed: "speed" }, units);
    expect(r.samples).toEqual([]);
    expect(r.issues).toEqual([
      { path: "rows.3.takeUpPosition", message: 'line 3, column "takeup": "abc" is not a number' },
      { path: "rows.4.time", message: "line 4: time 0.1 does not increase (previous 0.1)" },
      { path: "rows.5", message: "line 5 has 2 fields; the header has 3" },
      { path: "rows.6.trainSpeed", message: 'line 6, column "speed": "x" is not a number' },
    ]);
  });

  it("names a mapped column the file does not have", () => {
    const r = parseRecordingCsv("t,a\n0,1\n", { time: "t", takeUpPosition: "tension" }, units);
    expect(r.issues).toEqual([{ path: "mapping.takeUpPosition", message: 'the file has no column "tension"' }]);
  });

  it("converts to SI and keeps the take-up as the drop from its first reading", () => {
    const csv = "t,takeup,speed\n0,100,0\n0.5,95,9\n1,90,9\n";
    const r = parseRecordingCsv(csv, { time: "t", takeUpPosition: "takeup", trainSpeed: "speed" }, units);
    expect(r.issues).toEqual([]);
    expect(r.samples.map((s) => s.takeUpPosition)).toEqual([0, expect.closeTo(-0.005, 12), expect.closeTo(-0.01, 12)]);
    // Source: 1 km/h = 1/3.6 m/s exactly.
    expect(r.samples[1].trainSpeed).toBeCloseTo(2.5, 12);
    expect(detectEngagement(r.samples)).toBe(0.5);
    expect(readHeaders(csv)).toEqual(["t", "takeup", "speed"]);
  });

  it("reads a logger that counts the take-up upward, in inches and milliseconds", () => {
    const r = parseRecordingCsv("ms,tu\n0,0\n20,1\n", { time: "ms", takeUpPosition: "tu" }, unitsSchema.parse({ time: "ms", length: "in", takeUpDirection: "up" }));
    // Source: 1 in = 0.0254 m exactly.
    expect(r.samples[1]).toMatchObject({ t: 0.02, takeUpPosition: -0.0254 });
  });
});
