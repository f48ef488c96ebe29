// Study throughput (cases per minute) through the job pool with 1 and 2 worker threads: the same
// 12-case entry-speed study of the example lift hill each time. Appended to `npm run bench`.
// The machine's cores are shared: close to 2× with 2 workers needs 2 idle cores.
import { readFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { JobPool } from "@/lib/jobs/pool";
import { jobConfig } from "@/lib/jobs/config";
import type { SimulationOutcome, SimulationTask } from "@/lib/engine/protocol";
import { parseScenario } from "@/sim/schema";
import { caseScenario } from "./cases";
import { expandGrid } from "./schema";

const CASES = Number(process.env.BENCH_STUDY_CASES ?? 12);

async function throughput(workers: number, scenarios: unknown[]): Promise<{ perMin: number; seconds: number }> {
  // One organisation's study: it may use every worker, and no burst thread adds to the figure.
  const pool = new JobPool({ ...jobConfig(), workers, queueMax: scenarios.length, idleMs: 60_000, orgConcurrency: workers, burstThreads: 0 });
  const own = { organisationId: 1 };
  try {
    // Warm the threads (module load) so the figure is about cases, not start-up.
    await Promise.all(Array.from({ length: workers }, (_, i) => pool.run<SimulationOutcome, SimulationTask>({ runId: -1 - i, scenario: scenarios[0] }, own)));
    const t0 = performance.now();
    const outcomes = await Promise.all(scenarios.map((s, i) => pool.run<SimulationOutcome, SimulationTask>({ runId: i + 1, scenario: s }, own)));
    const seconds = (performance.now() - t0) / 1000;
    const failed = outcomes.filter((o) => !o.ok).length;
    if (failed) throw new Error(`${failed} case(s) failed in the bench`);
    return { perMin: (scenarios.length / seconds) * 60, seconds };
  } finally {
    await pool.close();
  }
}

async function main() {
  const file = JSON.parse(readFileSync(path.join(process.cwd(), "sim", "examples", "lift-hill-example.json"), "utf8"));
  const base = parseScenario({ ...file, run: { ...file.run, duration: 30, segments: 60 } });
  if (!base.ok) throw new Error("example scenario does not validate");
  const grid = expandGrid([{ key: "entrySpeed", range: { from: 0.5, to: 0.5 + 0.25 * (CASES - 1), step: 0.25 } }]);
  const scenarios = grid.map((values) => {
    const r = caseScenario(base.scenario, values, { chains: new Map(), train: { carMassEmpty: 1000, seatsPerCar: 4, riderMass: 75 } });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    return r.scenario;
  });
  console.log(`\nStudy throughput: ${scenarios.length} cases (example lift hill, 60 segments, 30 s), ${os.cpus().length} cores, load ${os.loadavg()[0].toFixed(2)}`);
  const one = await throughput(1, scenarios);
  console.log(`  1 worker : ${one.perMin.toFixed(1)} cases/min (${one.seconds.toFixed(2)} s)`);
  const two = await throughput(2, scenarios);
  console.log(`  2 workers: ${two.perMin.toFixed(1)} cases/min (${two.seconds.toFixed(2)} s)`);
  console.log(`  scaling  : ${(two.perMin / one.perMin).toFixed(2)}× with 2 workers (linear would be 2.00×)`);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
