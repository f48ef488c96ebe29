import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { toCsv } from "@/lib/csv/write";

// Source: RFC 4180 (quoting, CRLF line breaks); OWASP "CSV Injection" (cells starting with = + - @ tab CR).
describe("the one CSV writer", () => {
  it("defuses text that a spreadsheet would run as a formula", () => {
    const cells = ["=HYPERLINK(\"http://evil.example\",\"x\")", "+1+1", "-2+3", "@SUM(A1)", "\t=1", "\r=1", "=1\n+2"];
    const csv = toCsv(["name"], cells.map((c) => [c]));
    const back = Papa.parse<string[]>(csv.trim(), { newline: "\r\n" }).data.slice(1).map((r) => r[0]);
    expect(back).toEqual(cells.map((c) => `'${c}`));
  });

  it("keeps numbers (negative ones too) numeric and plain text as it is", () => {
    const csv = toCsv(["Case", "Rollback distance (mm)", "Status"], [[1, -12.5, "done"], [2, null, "Emberline, lift 2"]]);
    expect(csv).toBe('Case,Rollback distance (mm),Status\r\n1,-12.5,done\r\n2,,"Emberline, lift 2"\r\n');
  });

  it("quotes quotes and line breaks", () => {
    expect(toCsv(["a"], [['say "hi"\nthere']])).toBe('a\r\n"say ""hi""\nthere"\r\n');
  });
});
