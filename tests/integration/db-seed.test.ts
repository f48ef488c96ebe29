import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Sequelize } from "sequelize";
import { createSequelize } from "@/lib/db/sequelize";
import { MIGRATIONS_TABLE, migrateUp } from "@/lib/db/migrate";
import { runSeeds } from "@/lib/db/seed";
import { seedSteps } from "@/lib/db/seeds";
import { createScratchDatabase } from "./db-scratch";

let sequelize: Sequelize;
let drop: () => Promise<void>;

/** Row count per table (the migration record excluded). */
async function rowCounts(): Promise<Record<string, number>> {
  const raw = (await sequelize.getQueryInterface().showAllTables()) as (string | { tableName: string })[];
  const counts: Record<string, number> = {};
  for (const t of raw.map((r) => (typeof r === "string" ? r : r.tableName))) {
    if (t === MIGRATIONS_TABLE) continue;
    const [rows] = (await sequelize.query(`SELECT COUNT(*) AS n FROM \`${t}\``)) as [{ n: number | bigint }[], unknown];
    counts[t] = Number(rows[0].n);
  }
  return counts;
}

beforeAll(async () => {
  const scratch = await createScratchDatabase("seed");
  drop = scratch.drop;
  sequelize = createSequelize(scratch.config);
  await migrateUp(sequelize);
});

afterAll(async () => {
  await sequelize?.close();
  await drop?.();
});

describe("seed", () => {
  it("runs every step in order and, run twice, leaves the same rows as run once", async () => {
    expect(await runSeeds(sequelize)).toEqual(seedSteps.map((s) => s.name));
    const once = await rowCounts();
    await runSeeds(sequelize);
    const twice = await rowCounts();
    expect(twice).toEqual(once);
    // The steps must write through the instance they are given (here: the scratch database).
    const total = Object.values(once).reduce((a, b) => a + b, 0);
    if (seedSteps.length > 0) expect(total).toBeGreaterThan(0);
  });

  it("names the step that failed", async () => {
    const failing = [{ name: "broken step", run: async () => Promise.reject(new Error("no such table")) }];
    await expect(runSeeds(sequelize, () => {}, failing)).rejects.toThrow('Seed step "broken step" failed: no such table');
  });
});
