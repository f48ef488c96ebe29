import { spawn, type ChildProcess } from "node:child_process";
import crypto from "node:crypto";
import path from "node:path";
import { createSequelize } from "../../lib/db/sequelize";
import { migrateUp } from "../../lib/db/migrate";
import { runSeeds } from "../../lib/db/seed";
import { dbConfig, type DbConfig } from "../../lib/db/config";
import { destroyDatabase, instancePaths, portInUse, startDatabase } from "../../scripts/lib/mariadb";
import { stopChild } from "../../scripts/lib/lifecycle";
import { repoRoot } from "../../scripts/lib/settings";
import { sleep } from "./http-client";

/**
 * A private MariaDB (own data dir and port) with the demo data and `next start` on its own port, for
 * tests that must break things (kill the database) without touching the shared test database.
 */
export interface PrivateStack {
  db: DbConfig;
  dataDir: string;
  appUrl: string;
  env: NodeJS.ProcessEnv;
  app: ChildProcess;
  appLog: string[];
  stop(): Promise<void>;
}

export async function startPrivateStack(dbPort: number, appPort: number, extraEnv: Record<string, string> = {}): Promise<PrivateStack> {
  for (const port of [dbPort, appPort]) {
    if (await portInUse(port)) throw new Error(`port ${port} is in use: free it or pick another (FAULT_DB_PORT / FAULT_APP_PORT, LOAD_DB_PORT / LOAD_APP_PORT)`);
  }
  const dataDir = path.join(repoRoot, ".data", `fault-${dbPort}`);
  const paths = instancePaths(dataDir);
  await destroyDatabase(paths);
  const db = { ...dbConfig({ ...process.env, DB_HOST: "127.0.0.1", DB_PORT: String(dbPort), DB_NAME: "tautline_fault" }), poolMax: 5 };
  await startDatabase({ dataDir, config: db });
  const s = createSequelize(db);
  try {
    await migrateUp(s);
    await runSeeds(s);
  } finally {
    await s.close();
  }
  const appUrl = `http://127.0.0.1:${appPort}`;
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: "production",
    DB_HOST: db.host,
    DB_PORT: String(db.port),
    DB_NAME: db.database,
    DB_USER: db.user,
    DB_PASSWORD: db.password,
    DB_POOL_MAX: String(db.poolMax),
    PORT: String(appPort),
    NEXTAUTH_URL: appUrl,
    NEXTAUTH_SECRET: crypto.randomBytes(32).toString("base64url"),
    SMTP_URL: "smtp://127.0.0.1:9", // nothing here sends mail
    ...extraEnv,
  };
  const appLog: string[] = [];
  const app = spawn(process.execPath, [path.join(repoRoot, "node_modules", "next", "dist", "bin", "next"), "start", "-p", String(appPort), "-H", "127.0.0.1"], {
    cwd: repoRoot,
    env,
    stdio: ["ignore", "pipe", "pipe"],
  });
  const keep = (d: Buffer) => {
    appLog.push(String(d));
    if (appLog.length > 400) appLog.shift();
  };
  app.stdout!.on("data", keep);
  app.stderr!.on("data", keep);
  const deadline = Date.now() + 60_000;
  for (;;) {
    try {
      const res = await fetch(`${appUrl}/sign-in`, { signal: AbortSignal.timeout(2_000) });
      if (res.status < 500) break;
    } catch {
      // not up yet
    }
    if (app.exitCode !== null) throw new Error(`next start exited ${app.exitCode}: ${appLog.join("").slice(-1500)}`);
    if (Date.now() > deadline) throw new Error("next start did not answer within 60 s");
    await sleep(300);
  }
  return {
    db,
    dataDir,
    appUrl,
    env,
    app,
    appLog,
    stop: async () => {
      await stopChild(app).catch(() => undefined);
      await destroyDatabase(paths);
    },
  };
}
