import { describe, expect, it } from "vitest";
import { detectEngagement, parseRecordingCsv, readHeaders } from "@/lib/recordings/parse";
import { headerUnit, resolveUnits, suggestMapping } from "@/lib/recordings/headers";
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

describe("logger headers and number format", () => {
  it("reads [ms] and [kN] headers as milliseconds and kilonewtons whatever the file-wide defaults say", () => {
    const csv = "Time [ms],Chain tension [kN],Speed (km/h)\n0,10,9\n20,12.5,9\n40,15,18\n";
    const mapping = { time: "Time [ms]", chainTension: "Chain tension [kN]", trainSpeed: "Speed (km/h)" };
    const r = parseRecordingCsv(csv, mapping, unitsSchema.parse({ time: "s", force: "N", speed: "m/s" }));
    expect(r.issues).toEqual([]);
    // Source: SI prefixes (BIPM SI Brochure): 1 ms = 1e-3 s, 1 kN = 1e3 N; 1 km/h = 1/3.6 m/s.
    expect(r.samples.map((s) => s.t)).toEqual([0, 0.02, 0.04]);
    expect(r.samples.map((s) => s.chainTension)).toEqual([1e4, 1.25e4, 1.5e4]);
    expect(r.samples[2].trainSpeed).toBeCloseTo(5, 12);
    expect(r.units).toEqual({ time: { unit: "ms", from: "header" }, chainTension: { unit: "kN", from: "header" }, trainSpeed: { unit: "km/h", from: "header" } });
  });

  it("finds the unit in brackets, parentheses or a trailing word, and names what it cannot read", () => {
    expect(headerUnit("Load (lbf)")?.known).toEqual({ quantity: "force", unit: "lbf" });
    expect(headerUnit("train_speed_mps")?.known).toEqual({ quantity: "speed", unit: "m/s" });
    expect(headerUnit("speed km/h")?.known).toEqual({ quantity: "speed", unit: "km/h" });
    expect(headerUnit("takeup_mm")?.known).toEqual({ quantity: "length", unit: "mm" });
    expect(headerUnit("take up")).toBeNull();
    expect(headerUnit("Time [min]")).toEqual({ written: "min", known: null });
    const r = parseRecordingCsv("Time [min],Tension [mm]\n0,1\n1,2\n", { time: "Time [min]", chainTension: "Tension [mm]" }, {});
    expect(r.issues.map((i) => i.path)).toEqual(["columnUnits.time", "mapping.chainTension"]);
    expect(r.issues[0].message).toContain('"min"');
    expect(r.samples).toEqual([]);
  });

  it("lets the mapping step correct a header's unit, column by column", () => {
    const csv = "t [s],takeup [mm],train pos [m]\n0,0,0\n1,5,2\n";
    const r = parseRecordingCsv(csv, { time: "t [s]", takeUpPosition: "takeup [mm]", trainPosition: "train pos [m]" }, {}, { takeUpPosition: "in" });
    expect(r.samples[1].takeUpPosition).toBeCloseTo(5 * 0.0254, 12);
    expect(r.samples[1].trainPosition).toBe(2);
    expect(r.units.takeUpPosition).toEqual({ unit: "in", from: "chosen" });
  });

  it("reads a semicolon file with decimal commas once, not as one error per row", () => {
    const rows = ["Zeit [s];Kette [kN]"];
    for (let k = 0; k < 1001; k++) rows.push(`${(k / 100).toFixed(2).replace(".", ",")};${(10 + k / 1000).toFixed(3).replace(".", ",")}`);
    const r = parseRecordingCsv(rows.join("\r\n"), { time: "Zeit [s]", chainTension: "Kette [kN]" }, {});
    expect(r.issues).toEqual([]);
    expect(r.delimiter).toBe(";");
    expect(r.decimalComma).toBe(true);
    expect(r.samples).toHaveLength(1001);
    expect(r.samples[250].t).toBeCloseTo(2.5, 12);
    expect(r.samples[250].chainTension).toBeCloseTo(10250, 9);
  });

  it("guesses the columns by name and reads the units the headers state", () => {
    const m = suggestMapping(["Time [ms]", "Chain tension [kN]", "Take-up (in)", "Speed (mph)"]);
    expect(m).toEqual({ time: "Time [ms]", chainTension: "Chain tension [kN]", takeUpPosition: "Take-up (in)", trainSpeed: "Speed (mph)" });
    const units = resolveUnits(m, {}).columns;
    expect(Object.fromEntries(Object.entries(units).map(([k, u]) => [k, u.unit]))).toEqual({ time: "ms", chainTension: "kN", takeUpPosition: "in", trainSpeed: "mph" });
    // A column that states no unit is read in SI, and says so.
    expect(resolveUnits({ time: "t", trainSpeed: "v" }, {}).columns.trainSpeed).toEqual({ unit: "m/s", from: "assumed" });
  });
});
