import { createHash } from "node:crypto";
import path from "node:path";

/** Where one private MariaDB instance keeps its files. */
export interface InstancePaths {
  dataDir: string;
  socket: string;
  pidFile: string;
  logFile: string;
  installLog: string;
}

// Unix socket paths must stay under ~107 bytes; a deep CI checkout can exceed that, so the socket
// lives in /tmp under a short name derived from the (absolute) data dir: unique per instance, stable
// across runs.
export function socketPathFor(dataDir: string, tmpDir = "/tmp"): string {
  const id = createHash("sha256").update(path.resolve(dataDir)).digest("hex").slice(0, 12);
  return path.join(tmpDir, `tautline-db-${id}.sock`);
}

export function instancePaths(dataDir: string): InstancePaths {
  const abs = path.resolve(dataDir);
  return {
    dataDir: abs,
    socket: socketPathFor(abs),
    pidFile: path.join(abs, "mariadbd.pid"),
    logFile: path.join(abs, "mariadbd.log"),
    installLog: `${abs}.install.log`,
  };
}

/**
 * The data dir for an instance when DB_DATA_DIR is not set: `.data/demo` for the default port,
 * `.data/demo-<port>` for any other (so two instances never share files), `.data/test-<port>` for tests.
 */
export function defaultDataDir(repoRoot: string, kind: "demo" | "test", port: number): string {
  if (kind === "test") return path.join(repoRoot, ".data", `test-${port}`);
  return path.join(repoRoot, ".data", port === 3307 ? "demo" : `demo-${port}`);
}

export function dataDirFromEnv(repoRoot: string, env: Record<string, string | undefined>, kind: "demo" | "test", port: number): string {
  const given = env.DB_DATA_DIR?.trim();
  return given ? path.resolve(repoRoot, given) : defaultDataDir(repoRoot, kind, port);
}

/** SQL string literal body: backslash and quote escaped (MariaDB default sql_mode). */
export function sqlString(value: string): string {
  return `'${value.replace(/\\/g, "\\\\").replace(/'/g, "\\'")}'`;
}
