import { describe, expect, it } from "vitest";
import { readTyped } from "@/components/logbook/typed";

const FIELDS = [
  { key: "position", label: "Position", unit: "mm", required: true },
  { key: "links", label: "Links removed", unit: "links" },
];

describe("logbook numbers through the shared parser", () => {
  it("reads a decimal comma as a decimal point", () => {
    // Source: ISO 80000-1:2009 §7.3.2 — the decimal sign is a comma or a point on the line.
    expect(readTyped({ position: "2,5", links: "2" }, FIELDS)).toEqual({ values: { position: 2.5, links: 2 }, issues: {} });
  });

  it("refuses an ambiguous 1,234 and junk by the field's name and unit, and a required empty field", () => {
    const r = readTyped({ position: "1,234", links: "two" }, FIELDS);
    expect(r.values).toEqual({});
    // Source: ISO 80000-1:2009 §7.3.2 — digits may be grouped in threes, so 1,234 can be a grouped thousand.
    expect(r.issues.position).toBe('Position: "1,234" could be read two ways; type 1.234 or 1234 without a thousands separator (mm)');
    expect(r.issues.links).toBe('Links removed: "two" is not a number (links)');
    expect(readTyped({ links: "" }, FIELDS).issues).toEqual({ position: "Position must be a number in mm" });
  });
});
