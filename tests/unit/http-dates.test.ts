import { describe, expect, it } from "vitest";
import { readIsoDate } from "@/lib/http/dates";
import { entryInputSchema, entryListQuery } from "@/lib/logbook/schema";
import { auditListQuery } from "@/lib/audit/list";

const entry = (measuredAt: unknown) => entryInputSchema.safeParse({ kind: "take-up", liftId: 1, position: 1.2, measuredAt });

// Source: ISO 8601-1:2019 calendar date and time forms (from memory); MariaDB DATETIME range 1000-01-01
// to 9999-12-31 (MariaDB Knowledge Base, "DATETIME").
describe("dates sent to the API", () => {
  it.each([
    [-8.64e15, "a number (the earliest instant JavaScript knows)"],
    [true, "a boolean (Number(true) is 1 ms after 1970)"],
    ["1; DROP TABLE logbook_entries", "text a lenient parser reads as 2001"],
    ["2001 OR 1=1", "SQL-looking text"],
    ["275760-09-13", "a six-digit year"],
    ["10000-01-01", "a year past 9999"],
    ["9999-12-31T23:00:00-05:00", "an offset that lands in the year 10000"],
    ["1899-12-31", "before 1900"],
    ["2026-02-30", "a day that does not exist"],
    ["2026-05-01T25:00", "an hour that does not exist"],
    ["", "empty text"],
  ] as [unknown, string][])("refuses measuredAt %j (%s) with words naming the field", (value) => {
    const r = entry(value);
    expect(r.success).toBe(false);
    const issue = r.error!.issues.find((i) => i.path.join(".") === "measuredAt");
    expect(issue?.message).toMatch(/measuredAt/);
  });

  it.each([
    ["2026-05-01", "2026-05-01T00:00:00.000Z"],
    ["2026-05-01T08:00", new Date("2026-05-01T08:00").toISOString()],
    ["2026-05-01T08:00:00.000Z", "2026-05-01T08:00:00.000Z"],
    ["2026-05-01T08:00:00+02:00", "2026-05-01T06:00:00.000Z"],
    ["9999-12-31", "9999-12-31T00:00:00.000Z"],
  ])("reads %j", (text, iso) => {
    const r = readIsoDate(text);
    expect(r.ok && r.date.toISOString()).toBe(iso);
  });

  it("list filters refuse dates beyond the year 9999 (to=275760-09-13) and hex ids", () => {
    expect(entryListQuery.safeParse({ liftId: "3", to: "275760-09-13" }).success).toBe(false);
    expect(entryListQuery.safeParse({ liftId: "0x10" }).success).toBe(false);
    expect(auditListQuery.safeParse({ to: "275760-09-13" }).success).toBe(false);
    expect(auditListQuery.safeParse({ from: "2026-01-01", to: "2026-02-01" }).success).toBe(true);
  });
});
