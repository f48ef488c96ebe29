// Bringing up the services a command needs (database migrated and seeded, mail fake), stopped on exit if we started them.
import fs from "node:fs";
import path from "node:path";
import { createSequelize } from "../../lib/db/sequelize";
import { checkDatabase } from "../../lib/db/health";
import { migrateUp } from "../../lib/db/migrate";
import { runSeeds } from "../../lib/db/seed";
import type { Lifecycle } from "./lifecycle";
import { startMailFakeIfPresent } from "./mail";
import { ensureMariadbInstalled, startDatabase, stopDatabase, type RunningDb } from "./mariadb";
import { repoRoot, pointStorageAt, type Stack } from "./settings";
import { say, warn } from "./log";

export const nextBin = path.join(repoRoot, "node_modules", "next", "dist", "bin", "next");

/** Database up (reused if already running), migrated and seeded; stopped on exit if we started it. */
export async function bringUpDatabase(stack: Stack, life: Lifecycle): Promise<RunningDb> {
  await ensureMariadbInstalled();
  const db = await startDatabase({ dataDir: stack.dataDir, config: stack.db });
  if (db.startedHere) {
    life.onStop("MariaDB", async () => {
      say("stopping MariaDB");
      await stopDatabase(db.paths);
    });
  }
  const sequelize = createSequelize(stack.db);
  try {
    await checkDatabase(sequelize, stack.db);
    const applied = await migrateUp(sequelize, say);
    say(applied.length ? `applied ${applied.length} migration(s)` : "database schema is up to date");
    pointStorageAt(stack);
    await runSeeds(sequelize, say);
  } finally {
    await sequelize.close();
  }
  return db;
}

export async function bringUpMailFake(stack: Stack, life: Lifecycle): Promise<void> {
  const fake = await startMailFakeIfPresent(stack);
  if (fake) {
    life.onStop("mail fake", async () => {
      say("stopping the mail fake");
      await fake.close();
    });
  }
}

/** A one-line hint naming a demo account, read from the list the seed uses (when it exists). */
export async function demoSignInHint(): Promise<string> {
  const file = path.join(repoRoot, "lib", "auth", "demo-accounts.ts");
  if (!fs.existsSync(file)) return "Demo accounts: see README.md.";
  try {
    const specifier = file;
    const mod = (await import(specifier)) as {
      DEMO_PASSWORD?: string;
      DEMO_ACCOUNTS?: readonly { email: string; role: string }[];
    };
    const admin = mod.DEMO_ACCOUNTS?.find((a) => a.role === "admin");
    if (!admin || !mod.DEMO_PASSWORD) return "Demo accounts: see README.md.";
    return `Sign in as ${admin.email} with password ${mod.DEMO_PASSWORD} (one account per role: see README.md).`;
  } catch (err) {
    warn(`could not read the demo accounts: ${String(err)}`);
    return "Demo accounts: see README.md.";
  }
}

export function hasBuild(): boolean {
  return fs.existsSync(path.join(repoRoot, ".next", "BUILD_ID"));
}
