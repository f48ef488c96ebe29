import { Sequelize } from "sequelize";
import { dbConfig } from "./config";

const globalForDb = globalThis as unknown as { tautlineSequelize?: Sequelize };

function create(): Sequelize {
  const c = dbConfig();
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

/** One Sequelize instance per process (cached on globalThis so dev reloads don't leak pools). */
export function getSequelize(): Sequelize {
  if (!globalForDb.tautlineSequelize) globalForDb.tautlineSequelize = create();
  return globalForDb.tautlineSequelize;
}
