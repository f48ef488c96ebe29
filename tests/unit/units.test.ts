import { describe, expect, it } from "vitest";
import { convert, fromUnit, toUnit } from "@/sim/units";
import { display } from "@/lib/units/display";

// Source: NIST SP 811 / the 1959 international yard and pound agreement: 1 ft = 0.3048 m exactly,
// 1 lb = 0.45359237 kg exactly; 1 lbf = 4.4482216152605 N (lb × standard gravity 9.80665 m/s²);
// 1 hp = 550 ft·lbf/s = 745.69987158227022 W; 1 mi = 5280 ft.
describe("SI ↔ US customary", () => {
  it("length", () => {
    expect(fromUnit(1, "ft")).toBe(0.3048);
    expect(fromUnit(12, "in")).toBeCloseTo(0.3048, 15);
    expect(toUnit(1, "mm")).toBeCloseTo(1000, 12);
    expect(convert(400, "ft", "m")).toBeCloseTo(121.92, 12);
  });
  it("mass and force", () => {
    expect(fromUnit(1, "lb")).toBe(0.45359237);
    expect(fromUnit(1, "lbf")).toBeCloseTo(4.4482216152605, 12);
    expect(fromUnit(1, "kip")).toBeCloseTo(4448.2216152605, 8);
    // ASME B29 No. 240 minimum tensile strength 112,500 lbf ≈ 500 kN (docs/references.md).
    expect(toUnit(fromUnit(112500, "lbf"), "kN")).toBeCloseTo(500.42, 2);
  });
  it("speed, power, stiffness, mass per length, acceleration, torque", () => {
    expect(fromUnit(1, "mph")).toBeCloseTo(0.44704, 15);
    expect(fromUnit(1, "ft/s")).toBe(0.3048);
    expect(fromUnit(1, "hp")).toBeCloseTo(745.69987158227022, 9);
    expect(fromUnit(1, "lbf/strain")).toBeCloseTo(4.4482216152605, 12);
    expect(fromUnit(10, "lb/ft")).toBeCloseTo((10 * 0.45359237) / 0.3048, 12); // ≈ 14.88 kg/m
    expect(fromUnit(1, "g")).toBe(9.80665);
    expect(fromUnit(1, "lbf·ft")).toBeCloseTo(4.4482216152605 * 0.3048, 12);
  });
  it("round-trips and picks display units per system", () => {
    for (const u of ["ft", "in", "lb", "lbf", "kip", "mph", "hp", "lb/ft"] as const) expect(toUnit(fromUnit(3.7, u), u)).toBeCloseTo(3.7, 12);
    expect(display(1000, "force", "si")).toEqual({ value: 1, unit: "kN" });
    const us = display(4448.2216152605, "force", "us");
    expect(us.unit).toBe("kip");
    expect(us.value).toBeCloseTo(1, 12);
  });
});
