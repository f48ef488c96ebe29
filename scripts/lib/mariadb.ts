// The private MariaDB instance of a data dir: install, start (ready = root login on its socket, never by pid), create db and user, stop.
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { spawn } from "node:child_process";
import mariadb from "mariadb";
import type { DbConfig } from "../../lib/db/config";
import { dbTarget } from "../../lib/db/config";
import { ensureDebianPackages, MARIADB } from "./debian";
import { instancePaths, sqlString, type InstancePaths } from "./instance-paths";
import { capture, findBinary, sleep, tail } from "./proc";
import { say, warn } from "./log";

export { instancePaths, type InstancePaths };

export class DatabaseStartError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "DatabaseStartError";
  }
}

const isRoot = () => typeof process.getuid === "function" && process.getuid() === 0;

function bin(name: string): string {
  const p = findBinary(name);
  if (!p) throw new DatabaseStartError(`${name} not found: install Debian's mariadb-server (apt-get install -y mariadb-server).`);
  return p;
}

export async function ensureMariadbInstalled(): Promise<void> {
  await ensureDebianPackages([MARIADB]);
}

/** True when the instance's own socket accepts a root login: the only test of "running" we trust. */
export async function answersOnSocket(p: InstancePaths): Promise<boolean> {
  if (!fs.existsSync(p.socket)) return false;
  const r = await capture(bin("mariadb"), ["--no-defaults", "-S", p.socket, "-uroot", "-N", "-e", "select 1"], {
    timeoutMs: 5_000,
  });
  return r.code === 0;
}

/** True when something accepts TCP connections on 127.0.0.1:port. */
export function portInUse(port: number, host = "127.0.0.1"): Promise<boolean> {
  return new Promise((resolve) => {
    const s = net.connect({ port, host });
    const done = (v: boolean) => {
      s.destroy();
      resolve(v);
    };
    s.setTimeout(1_000, () => done(true));
    s.once("connect", () => done(true));
    s.once("error", () => done(false));
  });
}

/** True when the app credentials work against host:port (a server someone else started, say). */
export async function appLoginWorks(c: DbConfig): Promise<boolean> {
  try {
    const conn = await mariadb.createConnection({
      host: c.host,
      port: c.port,
      user: c.user,
      password: c.password,
      database: c.database,
      connectTimeout: 3_000,
    });
    await conn.end();
    return true;
  } catch {
    return false;
  }
}

function processState(pid: number): { alive: boolean; cmdline: string } {
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, "utf8");
    const state = stat.slice(stat.lastIndexOf(")") + 2, stat.lastIndexOf(")") + 3);
    const cmdline = fs.readFileSync(`/proc/${pid}/cmdline`, "utf8").replace(/\0/g, " ");
    return { alive: state !== "Z" && state !== "X", cmdline };
  } catch {
    return { alive: false, cmdline: "" };
  }
}

/** Pid of a live mariadbd serving this data dir, from the pid file (null when stale or absent). */
function livePid(p: InstancePaths): number | null {
  try {
    const pid = Number(fs.readFileSync(p.pidFile, "utf8").trim());
    if (!Number.isInteger(pid) || pid <= 0) return null;
    const s = processState(pid);
    return s.alive && s.cmdline.includes("mariadbd") && s.cmdline.includes(p.dataDir) ? pid : null;
  } catch {
    return null;
  }
}

function removeIfExists(file: string): void {
  try {
    fs.rmSync(file, { force: true });
  } catch {
    // nothing to remove
  }
}

/**
 * Initialises the data dir once. It is built in a sibling folder and renamed into place, so an
 * interrupted first run never leaves a half-made data dir behind that later starts would trip over.
 */
export async function initDataDir(p: InstancePaths): Promise<boolean> {
  if (fs.existsSync(path.join(p.dataDir, "mysql"))) return false;
  if (fs.existsSync(p.dataDir) && fs.readdirSync(p.dataDir).length > 0) {
    throw new DatabaseStartError(
      `${p.dataDir} exists but is not a MariaDB data dir (no mysql/ inside). Move it away or set DB_DATA_DIR.`,
    );
  }
  const building = `${p.dataDir}.init`;
  fs.rmSync(building, { recursive: true, force: true });
  fs.mkdirSync(building, { recursive: true });
  say(`initialising a MariaDB data dir in ${p.dataDir}`);
  const user = isRoot() ? "root" : os.userInfo().username;
  const r = await capture(bin("mariadb-install-db"), [
    "--no-defaults",
    `--datadir=${building}`,
    `--user=${user}`,
    "--auth-root-authentication-method=normal",
    "--skip-test-db",
  ]);
  fs.writeFileSync(p.installLog, r.stdout + r.stderr);
  if (r.code !== 0) {
    fs.rmSync(building, { recursive: true, force: true });
    throw new DatabaseStartError(`mariadb-install-db failed (exit ${r.code}):\n${tail(p.installLog)}`);
  }
  fs.rmSync(p.dataDir, { recursive: true, force: true });
  fs.renameSync(building, p.dataDir);
  fs.renameSync(p.installLog, path.join(p.dataDir, "install.log"));
  return true;
}

export interface StartOptions {
  dataDir: string;
  config: DbConfig;
  timeoutMs?: number;
}

export interface RunningDb {
  paths: InstancePaths;
  /** False when an already running server was reused: then we must not stop it. */
  startedHere: boolean;
  /** True when the server runs from our data dir (so root on its socket can set it up). */
  ours: boolean;
}

/**
 * Brings up the private instance for `dataDir` on 127.0.0.1:config.port and makes sure the database
 * and application user exist. Reuses a server already answering on its socket, or (when the app login
 * works) one already listening on the port.
 */
export async function startDatabase(opts: StartOptions): Promise<RunningDb> {
  const { config } = opts;
  const timeoutMs = opts.timeoutMs ?? Number(process.env.DB_START_TIMEOUT_MS ?? 30_000);
  const p = instancePaths(opts.dataDir);

  if (await answersOnSocket(p)) {
    say(`MariaDB from ${p.dataDir} is already running; reusing it`);
    await ensureAppDatabase(p, config);
    return { paths: p, startedHere: false, ours: true };
  }
  if (await portInUse(config.port)) {
    if (await appLoginWorks(config)) {
      say(`a MariaDB server is already running on ${dbTarget(config)}; reusing it`);
      return { paths: p, startedHere: false, ours: false };
    }
    throw new DatabaseStartError(
      `Port ${config.port} on 127.0.0.1 is taken by another program (or a MariaDB without our user ${config.user}). ` +
        `Stop it, or choose another port with DB_PORT (tests: TEST_DB_PORT).`,
    );
  }

  await initDataDir(p);

  const running = livePid(p);
  if (running) {
    // A mariadbd for this data dir is alive but not answering: it may be starting up. Give it time.
    say(`mariadbd (pid ${running}) for ${p.dataDir} is alive but not answering yet; waiting`);
  } else {
    // Stale files from a crash or a killed machine must not block the start.
    removeIfExists(p.pidFile);
    removeIfExists(p.socket);
    await launch(p, config.port);
  }
  await waitUntilAnswering(p, timeoutMs, running ?? undefined);
  await ensureAppDatabase(p, config);
  say(`MariaDB ready on ${dbTarget(config)} (data ${p.dataDir})`);
  return { paths: p, startedHere: !running, ours: true };
}

let exitedEarly: { code: number | null; signal: string | null } | null = null;

async function launch(p: InstancePaths, port: number): Promise<void> {
  exitedEarly = null;
  const user = isRoot() ? "root" : os.userInfo().username;
  // Its refusals (e.g. about --user) go to stderr before the log is open: send both to the log.
  const out = fs.openSync(p.logFile, "a");
  const child = spawn(
    bin("mariadbd"),
    [
      "--no-defaults", // must come first, or /etc/mysql is read (pid and socket under /run)
      `--datadir=${p.dataDir}`,
      `--socket=${p.socket}`,
      `--pid-file=${p.pidFile}`,
      `--log-error=${p.logFile}`,
      `--port=${port}`,
      "--bind-address=127.0.0.1",
      "--skip-networking=0",
      `--user=${user}`,
      "--character-set-server=utf8mb4",
      "--collation-server=utf8mb4_unicode_ci",
      "--skip-name-resolve",
    ],
    { detached: true, stdio: ["ignore", out, out] }, // own session: a Ctrl-C in the terminal must not kill it
  );
  fs.closeSync(out);
  child.on("exit", (code, signal) => (exitedEarly = { code, signal }));
  child.unref();
}

async function waitUntilAnswering(p: InstancePaths, timeoutMs: number, pid?: number): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (await answersOnSocket(p)) return;
    if (exitedEarly && !pid) {
      throw new DatabaseStartError(
        `mariadbd exited during start-up (code ${exitedEarly.code ?? exitedEarly.signal}). Log ${p.logFile}:\n${tail(p.logFile)}`,
      );
    }
    await sleep(200);
  }
  throw new DatabaseStartError(
    `MariaDB did not accept connections within ${Math.round(timeoutMs / 1000)} s. Log ${p.logFile}:\n${tail(p.logFile)}`,
  );
}

/** Runs SQL as root over the instance socket (SQL on stdin, so passwords stay out of `ps`). */
export async function rootSql(p: InstancePaths, sql: string): Promise<string> {
  const r = await capture(bin("mariadb"), ["--no-defaults", "-S", p.socket, "-uroot", "-N", "-B"], {
    input: sql,
    timeoutMs: 30_000,
  });
  if (r.code !== 0) throw new DatabaseStartError(`SQL as root failed: ${r.stderr.trim()}`);
  return r.stdout;
}

/**
 * The application database and user (idempotent; a changed DB_PASSWORD is applied). The user may also
 * create databases named `<DB_NAME>_…`, which integration tests use as scratch databases.
 */
export async function ensureAppDatabase(p: InstancePaths, c: DbConfig): Promise<void> {
  const db = c.database;
  const pw = sqlString(c.password);
  const lines = [
    `CREATE DATABASE IF NOT EXISTS \`${db}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;`,
  ];
  for (const host of ["127.0.0.1", "localhost"]) {
    const who = `'${c.user}'@'${host}'`;
    lines.push(
      `CREATE USER IF NOT EXISTS ${who} IDENTIFIED BY ${pw};`,
      `ALTER USER ${who} IDENTIFIED BY ${pw};`,
      `GRANT ALL PRIVILEGES ON \`${db}\`.* TO ${who};`,
      `GRANT ALL PRIVILEGES ON \`${db}\\_%\`.* TO ${who};`,
    );
  }
  lines.push("FLUSH PRIVILEGES;");
  await rootSql(p, lines.join("\n"));
}

/** Clean shutdown through mariadb-admin; waits until the server is gone. No-op when it is not running. */
export async function stopDatabase(p: InstancePaths, timeoutMs = 30_000): Promise<boolean> {
  if (!(await answersOnSocket(p))) {
    if (!livePid(p)) {
      removeIfExists(p.pidFile);
      removeIfExists(p.socket);
    }
    return false;
  }
  const r = await capture(bin("mariadb-admin"), ["--no-defaults", "-S", p.socket, "-uroot", "shutdown"], {
    timeoutMs,
  });
  if (r.code !== 0) warn(`mariadb-admin shutdown: ${r.stderr.trim()}`);
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    // mariadbd removes its pid file as the last step of a clean shutdown.
    if (!fs.existsSync(p.pidFile) && !(await answersOnSocket(p))) return true;
    await sleep(200);
  }
  throw new DatabaseStartError(`MariaDB in ${p.dataDir} did not shut down within ${timeoutMs / 1000} s. Log:\n${tail(p.logFile)}`);
}

/** Stops the instance (if running) and deletes its data dir: for the throwaway test database. */
export async function destroyDatabase(p: InstancePaths): Promise<void> {
  await stopDatabase(p);
  fs.rmSync(p.dataDir, { recursive: true, force: true });
  fs.rmSync(`${p.dataDir}.init`, { recursive: true, force: true });
  removeIfExists(p.installLog);
  removeIfExists(p.socket);
}
