import { execFile } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import mariadb from "mariadb";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { DbConfig } from "@/lib/db/config";
import { createSequelize } from "@/lib/db/sequelize";
import { migrateUp } from "@/lib/db/migrate";
import { runSeeds } from "@/lib/db/seed";
import { createScratchDatabase } from "./db-scratch";

const run = promisify(execFile);
const tsx = path.join(process.cwd(), "node_modules", ".bin", "tsx");

/** Every table's row count, CHECKSUM TABLE and definition: equal only when the data is the same. */
async function fingerprint(c: DbConfig): Promise<Record<string, { rows: number; checksum: string; create: string }>> {
  const conn = await mariadb.createConnection({ host: c.host, port: c.port, user: c.user, password: c.password, database: c.database });
  try {
    const tables = (await conn.query(
      "SELECT table_name AS t FROM information_schema.tables WHERE table_schema = ? AND table_type = 'BASE TABLE' ORDER BY table_name",
      [c.database],
    )) as { t: string }[];
    const out: Record<string, { rows: number; checksum: string; create: string }> = {};
    for (const { t } of tables) {
      const [n] = (await conn.query(`SELECT COUNT(*) AS n FROM \`${t}\``)) as { n: bigint }[];
      const [sum] = (await conn.query(`CHECKSUM TABLE \`${t}\` EXTENDED`)) as { Checksum: bigint | number | null }[];
      const [def] = (await conn.query(`SHOW CREATE TABLE \`${t}\``)) as Record<string, string>[];
      out[t] = { rows: Number(n.n), checksum: String(sum.Checksum), create: def["Create Table"] };
    }
    return out;
  } finally {
    await conn.end();
  }
}

const envFor = (c: DbConfig) => ({ ...process.env, DB_HOST: c.host, DB_PORT: String(c.port), DB_NAME: c.database, DB_USER: c.user, DB_PASSWORD: c.password });

describe("db:backup and db:restore", () => {
  let source: Awaited<ReturnType<typeof createScratchDatabase>>;
  let target: Awaited<ReturnType<typeof createScratchDatabase>>;
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "tautline-backup-"));

  beforeAll(async () => {
    source = await createScratchDatabase("bksrc");
    target = await createScratchDatabase("bkdst");
    const s = createSequelize(source.config);
    try {
      await migrateUp(s);
      await runSeeds(s); // the demo park: accounts, catalogue, lifts, trains, scenarios, finished runs with result blobs
    } finally {
      await s.close();
    }
  });

  afterAll(async () => {
    await source?.drop();
    await target?.drop();
    fs.rmSync(dir, { recursive: true, force: true });
  });

  it("round-trips the demo data exactly (rows, checksums, table definitions)", async () => {
    const file = path.join(dir, "demo.sql.gz");
    await run(tsx, ["scripts/db-backup.ts", "--out", file], { env: envFor(source.config), cwd: process.cwd() });
    expect(fs.statSync(file).size).toBeGreaterThan(1000);
    // The target is empty, so no --yes is needed; a second restore over it must ask for --yes.
    await run(tsx, ["scripts/db-restore.ts", file], { env: envFor(target.config), cwd: process.cwd() });
    const a = await fingerprint(source.config);
    const b = await fingerprint(target.config);
    expect(Object.keys(a).length).toBeGreaterThan(10);
    expect(a.runs.rows, "the demo runs are part of the backup").toBeGreaterThan(0);
    expect(b).toEqual(a);
    await expect(run(tsx, ["scripts/db-restore.ts", file], { env: envFor(target.config), cwd: process.cwd() })).rejects.toThrow(/--yes/);
  });
});
