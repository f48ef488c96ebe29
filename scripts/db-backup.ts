// npm run db:backup [-- --out FILE]: a consistent mariadb-dump of the database named by DB_* (the demo
// database by default) into .data/backups/<database>-<UTC time>.sql.gz (or FILE). Prints the file name.
import path from "node:path";
import { dbConfig } from "../lib/db/config";
import { dumpDatabase } from "./lib/dump";
import { repoRoot } from "./lib/settings";
import { errorMessage } from "./lib/log";

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const i = args.indexOf("--out");
  if (args.some((a, k) => a !== "--out" && k !== i + 1)) throw new Error(`unknown option in "${args.join(" ")}" (use --out FILE)`);
  const config = dbConfig();
  const stamp = new Date().toISOString().replace(/[-:]/g, "").replace(/\..*/, "Z");
  const out = i >= 0 && args[i + 1] ? path.resolve(args[i + 1]) : path.join(repoRoot, ".data", "backups", `${config.database}-${stamp}.sql.gz`);
  const t0 = Date.now();
  await dumpDatabase(config, out);
  console.log(`[tautline] backup of ${config.database} on ${config.host}:${config.port} written to ${out} (${((Date.now() - t0) / 1000).toFixed(1)} s)`);
}

main().catch((err) => {
  console.error(`[tautline] backup failed: ${errorMessage(err)}`);
  process.exit(1);
});
