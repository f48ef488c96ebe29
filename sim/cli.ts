/**
 * Command line: `npm run -s sim -- FILE [--segments N] [--series] [--sample-interval S] [--upgrade]`.
 * Reads `tautline-scenario/2` (and version 1, converted). Prints one JSON object on stdout: {"summary": {…}}
 * plus "series" with --series (per-train series in series.trains). --upgrade prints the scenario as a
 * version 2 document instead of running it. Invalid input: exit code 2 and the field path on stderr. A run
 * that stops: exit code 1.
 */
import { readFileSync } from "node:fs";
import { SimulationError } from "./errors";
import { parseScenario } from "./schema";
import { simulate } from "./simulate";

function fail(code: number, message: string): never {
  process.stderr.write(message.endsWith("\n") ? message : message + "\n");
  process.exit(code);
}

function main(argv: string[]): void {
  let file: string | undefined;
  let segments: number | undefined;
  let withSeries = false;
  let upgrade = false;
  let sampleInterval = 0.01;
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === "--segments") {
      const v = Number(argv[++i]);
      if (!Number.isInteger(v) || v < 4 || v > 2000) fail(2, "--segments: must be a whole number from 4 to 2000");
      segments = v;
    } else if (a === "--series") withSeries = true;
    else if (a === "--upgrade") upgrade = true;
    else if (a === "--sample-interval") {
      const v = Number(argv[++i]);
      if (!Number.isFinite(v) || v <= 0 || v > 60) fail(2, "--sample-interval: must be a number of seconds above 0 (at most 60)");
      sampleInterval = v;
    } else if (a === "--help" || a === "-h") {
      process.stdout.write("usage: npm run -s sim -- FILE [--segments N] [--series] [--sample-interval S] [--upgrade]\n");
      process.exit(0);
    } else if (a.startsWith("--")) fail(2, `${a}: unknown option`);
    else if (file === undefined) file = a;
    else fail(2, `${a}: only one scenario file may be given`);
  }
  if (!file) fail(2, "usage: npm run -s sim -- FILE [--segments N] [--series] [--sample-interval S] [--upgrade]");
  let text: string;
  try {
    text = readFileSync(file, "utf8");
  } catch (e) {
    fail(2, `${file}: cannot read the file (${(e as Error).message})`);
  }
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    fail(2, `${file}: not valid JSON (${(e as Error).message})`);
  }
  const parsed = parseScenario(data);
  if (!parsed.ok) fail(2, parsed.issues.map((i) => `${i.path}: ${i.message}`).join("\n"));
  if (upgrade) {
    process.stdout.write(JSON.stringify(parsed.scenario, null, 2) + "\n");
    return;
  }
  try {
    const r = simulate(parsed.scenario, { segments, sampleInterval, series: withSeries, frameBudget: 0 });
    const out: Record<string, unknown> = { summary: r.summary };
    if (withSeries) out.series = r.series;
    process.stdout.write(JSON.stringify(out) + "\n");
  } catch (e) {
    if (e instanceof SimulationError) fail(1, `simulation stopped (${e.code}): ${e.message}`);
    throw e;
  }
}

main(process.argv.slice(2));
