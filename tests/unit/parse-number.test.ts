import { describe, expect, it } from "vitest";
import { decimalMarkOf, detectDecimalMark, parseNumber } from "@/lib/units/parse-number";

// Source: ISO 80000-1:2009 §7.3.2 — the decimal sign is either the comma or the point on the line, and
// digits may be grouped in threes; CLDR number symbols give "," as the decimal mark of de/fr and "." of en.
describe("parseNumber", () => {
  it("reads a decimal comma and a decimal point alike", () => {
    expect(parseNumber("2,5")).toEqual({ ok: true, value: 2.5 });
    expect(parseNumber("2.5")).toEqual({ ok: true, value: 2.5 });
    expect(parseNumber("15,5")).toEqual({ ok: true, value: 15.5 });
    expect(parseNumber("0,125")).toEqual({ ok: true, value: 0.125 });
    expect(parseNumber(",5")).toEqual({ ok: true, value: 0.5 });
    expect(parseNumber(" -3 ")).toEqual({ ok: true, value: -3 });
    expect(parseNumber("1,5e7")).toEqual({ ok: true, value: 1.5e7 });
  });

  it("refuses a lone separator before three digits unless the reader's decimal mark says which", () => {
    const r = parseNumber("1,234");
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toBe('"1,234" could be read two ways; type 1.234 or 1234 without a thousands separator');
    expect(parseNumber("1,234", ",")).toEqual({ ok: true, value: 1.234 });
    expect(parseNumber("1.234")).toEqual({ ok: true, value: 1.234 });
    expect(parseNumber("1.234", ",").ok).toBe(false);
  });

  it("refuses grouped thousands and junk, and tells an empty field apart", () => {
    for (const t of ["1,234,567", "1.234,5", "1 234 567", "4..2", "abc", "2,5,"]) expect(parseNumber(t).ok).toBe(false);
    expect(parseNumber("   ")).toMatchObject({ ok: false, empty: true });
    expect(parseNumber("abc")).toMatchObject({ ok: false, empty: false, message: '"abc" is not a number' });
  });

  it("knows the decimal mark of a locale", () => {
    expect(decimalMarkOf("de-DE")).toBe(",");
    expect(decimalMarkOf("en-US")).toBe(".");
  });

  it("decides a file column's decimal mark once", () => {
    expect(detectDecimalMark(["0,00", "0,01", "12,5"])).toBe(",");
    expect(detectDecimalMark(["0.00", "0,5"])).toBe(".");
    expect(detectDecimalMark(["1,500", "2,250"])).toBe(".");
    expect(detectDecimalMark(["3", "4"])).toBe(".");
  });
});
