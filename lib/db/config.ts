/** Database settings from the environment, with defaults for the private loopback instance. */
export interface DbConfig {
  host: string;
  port: number;
  database: string;
  user: string;
  password: string;
  poolMax: number;
}

export function dbConfig(env: NodeJS.ProcessEnv = process.env): DbConfig {
  return {
    host: env.DB_HOST ?? "127.0.0.1",
    port: Number(env.DB_PORT ?? 3307),
    database: env.DB_NAME ?? "tautline",
    user: env.DB_USER ?? "tautline",
    password: env.DB_PASSWORD ?? "tautline-local",
    poolMax: Number(env.DB_POOL_MAX ?? 10),
  };
}
