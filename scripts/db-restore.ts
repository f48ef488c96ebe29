// npm run db:restore -- FILE [--yes]: loads a backup made by db:backup into the database named by DB_*.
// Tables in the backup replace the current ones; without --yes it refuses when the database has tables.
import mariadb from "mariadb";
import path from "node:path";
import { dbConfig } from "../lib/db/config";
import { restoreDatabase } from "./lib/dump";
import { errorMessage } from "./lib/log";

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const yes = args.includes("--yes");
  const files = args.filter((a) => a !== "--yes");
  if (files.length !== 1 || files[0].startsWith("--")) throw new Error("usage: npm run db:restore -- FILE [--yes]");
  const file = path.resolve(files[0]);
  const c = dbConfig();
  const conn = await mariadb.createConnection({ host: c.host, port: c.port, user: c.user, password: c.password, connectTimeout: 5_000 });
  try {
    await conn.query(`CREATE DATABASE IF NOT EXISTS \`${c.database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
    const [row] = (await conn.query("SELECT COUNT(*) AS n FROM information_schema.tables WHERE table_schema = ?", [c.database])) as { n: number }[];
    if (Number(row.n) > 0 && !yes) {
      throw new Error(`${c.database} already has ${row.n} table(s); stop the app and run again with --yes to replace them with the backup`);
    }
  } finally {
    await conn.end();
  }
  const t0 = Date.now();
  await restoreDatabase(c, file);
  console.log(`[tautline] restored ${file} into ${c.database} on ${c.host}:${c.port} (${((Date.now() - t0) / 1000).toFixed(1)} s)`);
}

main().catch((err) => {
  console.error(`[tautline] restore failed: ${errorMessage(err)}`);
  process.exit(1);
});
