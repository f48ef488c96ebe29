import { Sequelize } from "sequelize";
import { dbConfig, type DbConfig } from "./config";

/** A new Sequelize instance for the given settings (scripts and tests that target a chosen database). */
export function createSequelize(c: DbConfig = dbConfig()): Sequelize {
  return new Sequelize(c.database, c.user, c.password, {
    host: c.host,
    port: c.port,
    dialect: "mariadb",
    logging: false,
    pool: { max: c.poolMax, min: 0, idle: 10_000, acquire: 8_000 },
    dialectOptions: { connectTimeout: 5_000 },
    define: { underscored: true },
  });
}

const globalForDb = globalThis as unknown as { tautlineSequelize?: Sequelize };

/** One Sequelize instance per process (cached on globalThis so dev reloads don't leak pools). */
export function getSequelize(): Sequelize {
  if (!globalForDb.tautlineSequelize) globalForDb.tautlineSequelize = createSequelize();
  return globalForDb.tautlineSequelize;
}
