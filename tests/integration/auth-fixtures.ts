import { mkdtemp, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import type { Sequelize } from "sequelize";
import { migrateUp } from "@/lib/db/migrate";
import { getSequelize } from "@/lib/db/sequelize";
import { seedDemoAccounts } from "@/lib/auth/seed";
import { startMailFake, type FakeMessage, type MailFake } from "@/lib/mail/fake-server";
import { initModels } from "@/models";
import { createScratchDatabase } from "./db-scratch";

/**
 * A scratch database with every migration and the demo accounts, bound as the process-wide connection
 * (lib/auth code calls getSequelize()), plus a mail fake on free ports that SMTP_URL points at.
 */
export async function authWorld(tag: string) {
  const scratch = await createScratchDatabase(tag);
  // getSequelize() reads DB_NAME when it first connects; nothing in this worker has connected yet.
  process.env.DB_NAME = scratch.config.database;
  const sequelize: Sequelize = getSequelize();
  await migrateUp(sequelize);
  initModels(sequelize);
  await seedDemoAccounts(sequelize);
  const dir = await mkdtemp(path.join(os.tmpdir(), "tautline-mail-"));
  const mail: MailFake = await startMailFake({ smtpPort: 0, httpPort: 0, dir });
  process.env.SMTP_URL = `smtp://127.0.0.1:${mail.smtpPort}`;
  const mailUrl = `http://127.0.0.1:${mail.httpPort}`;
  return {
    sequelize,
    mailUrl,
    async messages(): Promise<FakeMessage[]> {
      return (await fetch(`${mailUrl}/messages`)).json() as Promise<FakeMessage[]>;
    },
    async close() {
      await mail.close();
      await sequelize.close();
      await scratch.drop();
      await rm(dir, { recursive: true, force: true });
    },
  };
}

/** The token from the first link in a message's text. */
export function tokenFrom(message: FakeMessage): string {
  const m = /token=([A-Za-z0-9_-]+)/.exec(message.text);
  if (!m) throw new Error(`No link token in "${message.subject}"`);
  return m[1];
}

/** Waits for background sends (the reset e-mail goes out after the answer). */
export async function waitFor<T>(fn: () => Promise<T | undefined>, ms = 5_000): Promise<T> {
  const until = Date.now() + ms;
  for (;;) {
    const v = await fn();
    if (v !== undefined) return v;
    if (Date.now() > until) throw new Error("Timed out waiting");
    await new Promise((r) => setTimeout(r, 50));
  }
}
