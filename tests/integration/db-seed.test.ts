import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Sequelize } from "sequelize";
import { createSequelize } from "@/lib/db/sequelize";
import { MIGRATIONS_TABLE, migrateUp } from "@/lib/db/migrate";
import { runSeeds } from "@/lib/db/seed";
import { seedSteps } from "@/lib/db/seeds";
import { createScratchDatabase } from "./db-scratch";
import { DEMO_REVIEW_COMMENT } from "@/lib/comments/seed";
import { initModels } from "@/models";

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

  it("does not write demo data again over edits when the server restarts", async () => {
    await runSeeds(sequelize);
    const { Comment, Lift } = initModels(sequelize);
    const comment = await Comment.findOne({ where: { body: DEMO_REVIEW_COMMENT } });
    expect(comment).not.toBeNull();
    await comment!.update({ body: "Reworded by the reviewer after the first look." });
    const lift = await Lift.findOne({ order: [["id", "ASC"]] });
    const liftName = lift!.name;
    await lift!.update({ name: `${liftName} (renamed)` });
    const before = await rowCounts();
    await runSeeds(sequelize); // a restart
    expect(await rowCounts()).toEqual(before);
    expect(await Comment.count({ where: { body: DEMO_REVIEW_COMMENT } })).toBe(0);
    expect(await Lift.count({ where: { name: liftName } })).toBe(0);
  });

  it("names the step that failed", async () => {
    const failing = [{ name: "broken step", run: async () => Promise.reject(new Error("no such table")) }];
    await expect(runSeeds(sequelize, () => {}, failing)).rejects.toThrow('Seed step "broken step" failed: no such table');
  });
});
