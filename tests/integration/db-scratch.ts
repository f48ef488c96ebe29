import crypto from "node:crypto";
import mariadb from "mariadb";
import { dbConfig, type DbConfig } from "@/lib/db/config";

/**
 * A scratch database `<DB_NAME>_<tag>_<random>` on the test server, so schema tests can go up and down
 * without disturbing the shared test database the other integration and e2e tests use.
 */
export async function createScratchDatabase(tag: string): Promise<{ config: DbConfig; drop: () => Promise<void> }> {
  const base = dbConfig();
  const name = `${base.database}_${tag}_${crypto.randomBytes(3).toString("hex")}`;
  const admin = () =>
    mariadb.createConnection({ host: base.host, port: base.port, user: base.user, password: base.password, connectTimeout: 5_000 });
  const conn = await admin();
  try {
    await conn.query(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  } finally {
    await conn.end();
  }
  return {
    config: { ...base, database: name, poolMax: 2 },
    drop: async () => {
      const c = await admin();
      try {
        await c.query(`DROP DATABASE IF EXISTS \`${name}\``);
      } finally {
        await c.end();
      }
    },
  };
}
