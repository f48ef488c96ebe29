// npm test's parts (`--only unit,sim,integration,e2e`) and reading the vitest / Playwright JSON reports.
import fs from "node:fs";

export type Part = "unit" | "sim" | "integration" | "e2e";
export const ALL_PARTS: Part[] = ["unit", "sim", "integration", "e2e"];

/** Which vitest folder holds each part's tests. */
export const VITEST_DIRS: [Part, string][] = [
  ["unit", "tests/unit/"],
  ["sim", "tests/sim/"],
  ["integration", "tests/integration/"],
];

/** `--only unit --only e2e` or `--only unit,e2e`; no --only means every part. */
export function parseParts(argv: string[]): Set<Part> {
  const chosen: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === "--only") chosen.push(...(argv[++i] ?? "").split(","));
    else if (a.startsWith("--only=")) chosen.push(...a.slice("--only=".length).split(","));
    else if (a === "--files") i++; // read by filesOption in scripts/test.ts
    else if (a.startsWith("--files=")) continue;
    else throw new Error(`unknown option "${a}" (use --only ${ALL_PARTS.join("|")})`);
  }
  const names = chosen.map((s) => s.trim()).filter(Boolean);
  if (names.length === 0 && chosen.length > 0) throw new Error(`--only needs one of ${ALL_PARTS.join(", ")}`);
  for (const n of names) {
    if (!ALL_PARTS.includes(n as Part)) throw new Error(`unknown part "${n}" (use ${ALL_PARTS.join(", ")})`);
  }
  return new Set((names.length ? names : ALL_PARTS) as Part[]);
}

export interface Counts {
  passed: number;
  failed: number;
}

function readJson(file: string): unknown {
  try {
    return JSON.parse(fs.readFileSync(file, "utf8"));
  } catch {
    return null;
  }
}

/** Counts from vitest's JSON reporter (Jest-compatible fields). */
export function readVitestCounts(file: string): Counts | null {
  const r = readJson(file) as { numPassedTests?: number; numFailedTests?: number; numFailedTestSuites?: number } | null;
  if (!r || typeof r.numPassedTests !== "number") return null;
  // A test file that fails to load is a failed suite without a failed test: count it once.
  const failed = r.numFailedTests || r.numFailedTestSuites || 0;
  return { passed: r.numPassedTests, failed };
}

/** Counts from Playwright's JSON reporter: flaky tests passed on a retry. */
export function readPlaywrightCounts(file: string): Counts | null {
  const r = readJson(file) as { stats?: { expected?: number; unexpected?: number; flaky?: number } } | null;
  if (!r?.stats) return null;
  return { passed: (r.stats.expected ?? 0) + (r.stats.flaky ?? 0), failed: r.stats.unexpected ?? 0 };
}
