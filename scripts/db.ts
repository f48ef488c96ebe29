// Developer commands for the private MariaDB: npm run db:start | db:stop | db:migrate | db:migrate:down | db:seed | db:status
// They honour DB_PORT and DB_DATA_DIR (and the other DB_* settings).
import { createSequelize } from "../lib/db/sequelize";
import { checkDatabase } from "../lib/db/health";
import { migrateDown, migrateUp, migrationStatus } from "../lib/db/migrate";
import { runSeeds } from "../lib/db/seed";
import { dbTarget } from "../lib/db/config";
import { answersOnSocket, ensureMariadbInstalled, instancePaths, startDatabase, stopDatabase } from "./lib/mariadb";
import { demoStack } from "./lib/settings";
import { errorMessage, say } from "./lib/log";

const USAGE = `usage: tsx scripts/db.ts start | stop | migrate | migrate:down [--to 0|NAME] | seed | status`;

async function withDb<T>(fn: (sequelize: ReturnType<typeof createSequelize>) => Promise<T>): Promise<T> {
  const { db } = demoStack();
  const sequelize = createSequelize(db);
  try {
    await checkDatabase(sequelize, db);
    return await fn(sequelize);
  } finally {
    await sequelize.close();
  }
}

function toOption(args: string[]): 0 | string | undefined {
  const i = args.indexOf("--to");
  if (i < 0) return undefined;
  const v = args[i + 1];
  if (v === undefined) throw new Error("--to needs 0 or a migration name");
  return v === "0" ? 0 : v;
}

async function main(): Promise<void> {
  const [command, ...rest] = process.argv.slice(2);
  const stack = demoStack();
  const paths = instancePaths(stack.dataDir);
  switch (command) {
    case "start": {
      await ensureMariadbInstalled();
      await startDatabase({ dataDir: stack.dataDir, config: stack.db });
      say(`socket ${paths.socket}; stop with: npm run db:stop`);
      break;
    }
    case "stop": {
      const stopped = await stopDatabase(paths);
      say(stopped ? `MariaDB in ${paths.dataDir} stopped` : `no MariaDB running from ${paths.dataDir}`);
      break;
    }
    case "migrate": {
      const names = await withDb((s) => migrateUp(s, say));
      say(names.length ? `applied ${names.length} migration(s)` : "database is up to date");
      break;
    }
    case "migrate:down": {
      const to = toOption(rest);
      const names = await withDb((s) => migrateDown(s, to === undefined ? {} : { to }, say));
      say(names.length ? `reverted ${names.join(", ")}` : "nothing to revert");
      break;
    }
    case "seed": {
      const names = await withDb((s) => runSeeds(s, say));
      say(`ran ${names.length} seed step(s)`);
      break;
    }
    case "status": {
      const running = await answersOnSocket(paths);
      say(`server from ${paths.dataDir}: ${running ? "running" : "not running"} (${dbTarget(stack.db)})`);
      const st = await withDb((s) => migrationStatus(s));
      for (const n of st.executed) console.log(`  applied  ${n}`);
      for (const n of st.pending) console.log(`  pending  ${n}`);
      say(`${st.executed.length} applied, ${st.pending.length} pending`);
      break;
    }
    default:
      console.error(USAGE);
      process.exitCode = 2;
  }
}

main().catch((err) => {
  console.error(`[tautline] ${errorMessage(err)}`);
  process.exitCode = 1;
});
