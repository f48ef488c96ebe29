import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Sequelize } from "sequelize";
import { createSequelize } from "@/lib/db/sequelize";
import { MIGRATIONS_TABLE, migrateDown, migrateUp, migrationStatus } from "@/lib/db/migrate";
import { migrations } from "@/migrations";
import { createScratchDatabase } from "./db-scratch";

// Runs against the real test MariaDB that npm test starts, in a scratch database of its own.
let sequelize: Sequelize;
let drop: () => Promise<void>;

async function tables(): Promise<string[]> {
  const rows = (await sequelize.getQueryInterface().showAllTables()) as (string | { tableName: string })[];
  return rows.map((r) => (typeof r === "string" ? r : r.tableName)).sort();
}

beforeAll(async () => {
  const scratch = await createScratchDatabase("migrations");
  drop = scratch.drop;
  sequelize = createSequelize(scratch.config);
});

afterAll(async () => {
  await sequelize?.close();
  await drop?.();
});

describe("migrations on an empty database", () => {
  const names = migrations.map((m) => m.name);

  it("apply every registered migration in order, and a second run applies nothing", async () => {
    expect(await migrateUp(sequelize)).toEqual(names);
    expect(await migrateUp(sequelize)).toEqual([]);
    expect(await migrationStatus(sequelize)).toEqual({ executed: names, pending: [] });
    expect(await tables()).toContain(MIGRATIONS_TABLE);
  });

  it("step down one at a time from the newest", async () => {
    if (names.length === 0) return;
    expect(await migrateDown(sequelize)).toEqual([names[names.length - 1]]);
    expect((await migrationStatus(sequelize)).pending).toEqual([names[names.length - 1]]);
  });

  it("go down to zero leaving no table behind but the migration record", async () => {
    await migrateDown(sequelize, { to: 0 });
    expect(await migrationStatus(sequelize)).toEqual({ executed: [], pending: names });
    expect(await tables()).toEqual([MIGRATIONS_TABLE]);
  });

  it("come up again to the same tables", async () => {
    await migrateUp(sequelize);
    const after = await tables();
    expect(after.length).toBe(names.length === 0 ? 1 : after.length);
    expect((await migrationStatus(sequelize)).pending).toEqual([]);
    await migrateDown(sequelize, { to: 0 });
    await migrateUp(sequelize);
    expect(await tables()).toEqual(after);
  });
});
