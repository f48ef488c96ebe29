/** Database settings from the environment, with defaults for the private loopback instance. */
export interface DbConfig {
  host: string;
  port: number;
  database: string;
  user: string;
  password: string;
  poolMax: number;
}

/** A setting that cannot be used as given; the message names the variable and what it expects. */
export class ConfigError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "ConfigError";
  }
}

/** A TCP port from the environment: an integer 1–65535, or the fallback when unset or empty. */
export function parsePort(value: string | undefined, name: string, fallback: number): number {
  if (value === undefined || value.trim() === "") return fallback;
  const n = Number(value.trim());
  if (!Number.isInteger(n) || n < 1 || n > 65535) {
    throw new ConfigError(`${name} must be a port number between 1 and 65535 (got "${value}").`);
  }
  return n;
}

function parsePositiveInt(value: string | undefined, name: string, fallback: number): number {
  if (value === undefined || value.trim() === "") return fallback;
  const n = Number(value.trim());
  if (!Number.isInteger(n) || n < 1) throw new ConfigError(`${name} must be a whole number above 0 (got "${value}").`);
  return n;
}

// Names go into SQL identifiers when the scripts create the database and user, so keep them plain.
const PLAIN_NAME = /^[A-Za-z0-9_]{1,64}$/;

function parseName(value: string | undefined, name: string, fallback: string): string {
  const v = value === undefined || value.trim() === "" ? fallback : value.trim();
  if (!PLAIN_NAME.test(v)) throw new ConfigError(`${name} may use only letters, digits and _ (1–64 characters; got "${v}").`);
  return v;
}

/** Environment variables as read here (plain records are fine, e.g. in tests). */
export type Env = Record<string, string | undefined>;

export function dbConfig(env: Env = process.env): DbConfig {
  return {
    host: env.DB_HOST?.trim() || "127.0.0.1",
    port: parsePort(env.DB_PORT, "DB_PORT", 3307),
    database: parseName(env.DB_NAME, "DB_NAME", "tautline"),
    user: parseName(env.DB_USER, "DB_USER", "tautline"),
    password: env.DB_PASSWORD ?? "tautline-local",
    poolMax: parsePositiveInt(env.DB_POOL_MAX, "DB_POOL_MAX", 10),
  };
}

/** "host:port", for messages. */
export function dbTarget(c: Pick<DbConfig, "host" | "port">): string {
  return `${c.host}:${c.port}`;
}
