import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { parseParts, readPlaywrightCounts, readVitestCounts } from "@/scripts/lib/test-parts";

function tempJson(value: unknown): string {
  const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "tl-report-")), "r.json");
  fs.writeFileSync(file, JSON.stringify(value));
  return file;
}

describe("npm test -- --only", () => {
  it("runs every part by default", () => {
    expect([...parseParts([])]).toEqual(["unit", "sim", "integration", "e2e"]);
  });

  it("accepts repeated and comma-separated parts", () => {
    expect([...parseParts(["--only", "unit"])]).toEqual(["unit"]);
    expect([...parseParts(["--only", "unit,e2e"])].sort()).toEqual(["e2e", "unit"]);
    expect([...parseParts(["--only=sim", "--only", "integration"])].sort()).toEqual(["integration", "sim"]);
  });

  it("refuses unknown parts and options with a clear message", () => {
    expect(() => parseParts(["--only", "everything"])).toThrow(/unknown part "everything"/);
    expect(() => parseParts(["--fast"])).toThrow(/unknown option "--fast"/);
    expect(() => parseParts(["--only"])).toThrow(/--only needs/);
  });
});

describe("reporter counts", () => {
  it("reads vitest's JSON counts, counting a file that failed to load", () => {
    expect(readVitestCounts(tempJson({ numPassedTests: 7, numFailedTests: 2, numFailedTestSuites: 1 }))).toEqual({ passed: 7, failed: 2 });
    expect(readVitestCounts(tempJson({ numPassedTests: 3, numFailedTests: 0, numFailedTestSuites: 1 }))).toEqual({ passed: 3, failed: 1 });
    expect(readVitestCounts("/nonexistent/report.json")).toBeNull();
  });

  it("reads Playwright's JSON stats; a flaky test passed on retry", () => {
    expect(readPlaywrightCounts(tempJson({ stats: { expected: 5, unexpected: 1, flaky: 1, skipped: 2 } }))).toEqual({ passed: 6, failed: 1 });
    expect(readPlaywrightCounts(tempJson({ suites: [] }))).toBeNull();
  });
});
