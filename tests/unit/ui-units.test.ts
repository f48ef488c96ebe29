import { describe, expect, it } from "vitest";
import { editText, formatQuantity, fromDisplay, parseTyped, toDisplay, unitOf } from "@/lib/client/units";

describe("display units", () => {
  it("shows SI values in the SI display units", () => {
    expect(unitOf("force", "si").label).toBe("kN");
    expect(formatQuantity(161_283, "force", "si")).toBe("161.3 kN");
    expect(formatQuantity(0.1253, "smallLength", "si")).toBe("125.3 mm");
    expect(formatQuantity(null, "force", "si")).toBe("—");
  });

  it("converts to US customary with the exact definitions", () => {
    // Source: NIST SP 811 appendix B: 1 ft = 0.3048 m exactly, 1 lb = 0.45359237 kg exactly,
    // 1 lbf = 4.4482216152605 N, 1 hp (550 ft·lbf/s) = 745.699872 W.
    expect(toDisplay(0.3048, "length", "us")).toBeCloseTo(1, 12);
    expect(toDisplay(0.45359237, "mass", "us")).toBeCloseTo(1, 12);
    expect(toDisplay(4448.2216152605, "force", "us")).toBeCloseTo(1, 9); // 1 kip
    expect(toDisplay(745.699872, "power", "us")).toBeCloseTo(1, 6);
    expect(toDisplay(1, "massPerLength", "us")).toBeCloseTo(0.3048 / 0.45359237, 12); // kg/m → lb/ft
    expect(toDisplay(0.0254, "smallLength", "us")).toBeCloseTo(1, 12);
    expect(unitOf("speed", "us").label).toBe("ft/s");
  });

  it("round-trips what is typed in either system", () => {
    for (const q of ["length", "mass", "force", "speed", "massPerLength", "axialStiffness", "power", "smallLength"] as const) {
      for (const si of [0.1016, 2.5, 5000, 1.5e7]) {
        expect(fromDisplay(toDisplay(si, q, "us"), q, "us")).toBeCloseTo(si, 6);
        expect(fromDisplay(toDisplay(si, q, "si"), q, "si")).toBeCloseTo(si, 9);
      }
    }
    expect(editText(40, "angle", "us")).toBe("40");
    // A converted value is shown to the quantity's significant figures, not as a raw float.
    expect(editText(122, "length", "us")).toBe("400.3");
    expect(editText(15, "length", "us")).toBe("49.21");
    expect(editText(2.5, "speed", "us")).toBe("8.2");
    expect(editText(14.125, "length", "si")).toBe("14.125");
  });

  it("parses typed numbers and rejects junk", () => {
    expect(parseTyped(" 38 ")).toBe(38);
    expect(parseTyped("1.5e7")).toBe(1.5e7);
    // "1,200" could be 1.2 or 1200: refused rather than read as either.
    expect(parseTyped("1,200")).toBeUndefined();
    expect(parseTyped("2,5")).toBe(2.5);
    expect(parseTyped("")).toBeUndefined();
    expect(parseTyped("abc")).toBeUndefined();
    expect(parseTyped("4..2")).toBeUndefined();
  });
});
