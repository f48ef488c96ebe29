import mariadb from "mariadb";
import { dbConfig } from "@/lib/db/config";

/**
 * Read-only look-ups in the test database the server under test uses (same settings as
 * playwright.config.ts gives the server).
 */
export async function query<T>(sql: string, params: unknown[] = []): Promise<T[]> {
  const c = dbConfig({ ...process.env, DB_PORT: process.env.DB_PORT ?? process.env.TEST_DB_PORT ?? "3308" });
  const conn = await mariadb.createConnection({ host: c.host, port: c.port, user: c.user, password: c.password, database: c.database });
  try {
    return (await conn.query(sql, params)) as T[];
  } finally {
    await conn.end();
  }
}
