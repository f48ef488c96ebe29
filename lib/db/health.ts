import {
  AccessDeniedError,
  ConnectionAcquireTimeoutError,
  ConnectionError,
  ConnectionRefusedError,
  ConnectionTimedOutError,
  HostNotFoundError,
  HostNotReachableError,
  type Sequelize,
} from "sequelize";
import { HttpError, unavailable } from "../http/errors";
import { dbConfig, dbTarget, type DbConfig } from "./config";
import { getSequelize } from "./sequelize";
import { noteDatabaseLost } from "./change-tracker";

// Driver codes that mean "the server went away" even when Sequelize wraps them as a plain DatabaseError.
const LOST_CODES = new Set([
  "ECONNREFUSED",
  "ECONNRESET",
  "EPIPE",
  "ETIMEDOUT",
  "ENOTFOUND",
  "EHOSTUNREACH",
  "ER_SOCKET_UNEXPECTED_CLOSE",
  "ER_CONNECTION_TIMEOUT",
  "ER_GET_CONNECTION_TIMEOUT",
  "ER_CONNECTION_ALREADY_CLOSED",
  "ER_CMD_CONNECTION_CLOSED",
  "ER_SERVER_SHUTDOWN",
  "PROTOCOL_CONNECTION_LOST",
]);

function codeOf(err: unknown): string | undefined {
  const e = err as { code?: unknown; parent?: { code?: unknown }; original?: { code?: unknown } } | null;
  const code = e?.parent?.code ?? e?.original?.code ?? e?.code;
  return typeof code === "string" ? code : undefined;
}

/** True for errors that mean "cannot reach or log in to the database", not a bad query. */
export function isDbConnectionError(err: unknown): boolean {
  if (err instanceof ConnectionError) return true;
  const code = codeOf(err);
  return code !== undefined && LOST_CODES.has(code);
}

function reason(err: unknown): string {
  if (err instanceof ConnectionRefusedError || codeOf(err) === "ECONNREFUSED") return "connection refused: nothing is listening there";
  if (err instanceof AccessDeniedError) return "the server refused the user name or password (DB_USER / DB_PASSWORD)";
  if (err instanceof HostNotFoundError || err instanceof HostNotReachableError) return "the host cannot be found or reached (DB_HOST)";
  if (err instanceof ConnectionTimedOutError || err instanceof ConnectionAcquireTimeoutError) return "the connection timed out";
  return err instanceof Error ? err.message : String(err);
}

/** host:port from a socket error (Node puts them on ECONNREFUSED and friends), when present. */
function errorTarget(err: unknown): string | undefined {
  const e = err as { parent?: { address?: unknown; port?: unknown }; original?: { address?: unknown; port?: unknown } } | null;
  const src = e?.parent ?? e?.original;
  return typeof src?.address === "string" && typeof src.port === "number" ? `${src.address}:${src.port}` : undefined;
}

/** The sentence shown to a developer when the database cannot be reached. */
export function dbUnreachableMessage(err: unknown, c: DbConfig = dbConfig()): string {
  return (
    `Cannot reach the Tautline database at ${errorTarget(err) ?? dbTarget(c)} (${reason(err)}). ` +
    `Start it with \`npm start\` or \`npm run db:start\`, or point DB_HOST / DB_PORT at a running MariaDB.`
  );
}

export class DatabaseUnavailableError extends Error {
  constructor(message: string, options?: { cause?: unknown }) {
    super(message, options);
    this.name = "DatabaseUnavailableError";
  }
}

/** Connects once; throws DatabaseUnavailableError with a clear message when the database is out of reach. */
export async function checkDatabase(sequelize: Sequelize = getSequelize(), c: DbConfig = dbConfig()): Promise<void> {
  try {
    await sequelize.authenticate();
  } catch (err) {
    if (isDbConnectionError(err)) throw new DatabaseUnavailableError(dbUnreachableMessage(err, c), { cause: err });
    throw err;
  }
}

/**
 * For API code: a connection failure becomes HttpError 503 (with Retry-After); anything else comes back
 * unchanged. The details (host:port, how to start it) go to the server log and, outside production,
 * into the answer too.
 */
export function dbHttpError(err: unknown, c: DbConfig = dbConfig()): unknown {
  if (err instanceof HttpError || !isDbConnectionError(err)) return err;
  // Answers kept in memory are not served while the database is away: the API says it is unavailable.
  noteDatabaseLost();
  const detail = dbUnreachableMessage(err, c);
  console.error(detail);
  return unavailable(
    process.env.NODE_ENV === "production" ? "The database is not reachable right now. Try again shortly." : detail,
  );
}

/** Runs `fn`, turning database connection failures into HttpError 503. Use inside a route() handler. */
export async function withDatabase<T>(fn: () => Promise<T>): Promise<T> {
  try {
    return await fn();
  } catch (err) {
    throw dbHttpError(err);
  }
}
