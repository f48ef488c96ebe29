import { spawn } from "node:child_process";
import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import zlib from "node:zlib";
import { pipeline } from "node:stream/promises";
import type { DbConfig } from "../../lib/db/config";

/** A client option file (mode 600) so the password never appears on a command line or in `ps`. */
function optionFile(c: DbConfig): { file: string; remove: () => void } {
  const file = path.join(os.tmpdir(), `tautline-dump-${crypto.randomBytes(6).toString("hex")}.cnf`);
  fs.writeFileSync(file, `[client]\nhost=${c.host}\nport=${c.port}\nuser=${c.user}\npassword="${c.password.replace(/(["\\])/g, "\\$1")}"\n`, { mode: 0o600 });
  return { file, remove: () => fs.rmSync(file, { force: true }) };
}

function waitFor(child: ReturnType<typeof spawn>, what: string, stderr: string[]): Promise<void> {
  return new Promise((resolve, reject) => {
    child.on("error", reject);
    child.on("close", (code) => (code === 0 ? resolve() : reject(new Error(`${what} exited ${code}: ${stderr.join("").trim().slice(0, 500)}`))));
  });
}

/**
 * Writes a consistent dump of the whole database (one transaction snapshot: writes may go on meanwhile),
 * gzipped when the file name ends in .gz. Schema, rows (blobs as hex) and the migration records.
 */
export async function dumpDatabase(c: DbConfig, outFile: string): Promise<void> {
  const opts = optionFile(c);
  try {
    fs.mkdirSync(path.dirname(outFile), { recursive: true });
    const tmp = `${outFile}.part`;
    const child = spawn(
      "mariadb-dump",
      [`--defaults-extra-file=${opts.file}`, "--single-transaction", "--quick", "--hex-blob", "--routines", "--triggers", "--default-character-set=utf8mb4", "--skip-dump-date", "--no-tablespaces", c.database],
      { stdio: ["ignore", "pipe", "pipe"] },
    );
    const stderr: string[] = [];
    child.stderr!.on("data", (d) => stderr.push(String(d)));
    const done = waitFor(child, "mariadb-dump", stderr);
    const out = fs.createWriteStream(tmp, { mode: 0o600 });
    await Promise.all([outFile.endsWith(".gz") ? pipeline(child.stdout!, zlib.createGzip(), out) : pipeline(child.stdout!, out), done]);
    fs.renameSync(tmp, outFile); // a failed dump never leaves a file that looks complete
  } finally {
    opts.remove();
  }
}

/** Loads a dump into the database (created when missing). Tables in the dump are dropped and recreated. */
export async function restoreDatabase(c: DbConfig, inFile: string): Promise<void> {
  if (!fs.existsSync(inFile)) throw new Error(`no backup file at ${inFile}`);
  const opts = optionFile(c);
  try {
    const child = spawn("mariadb", [`--defaults-extra-file=${opts.file}`, "--default-character-set=utf8mb4", c.database], { stdio: ["pipe", "ignore", "pipe"] });
    const stderr: string[] = [];
    child.stderr!.on("data", (d) => stderr.push(String(d)));
    const done = waitFor(child, "mariadb (restore)", stderr);
    const src = fs.createReadStream(inFile);
    await Promise.all([inFile.endsWith(".gz") ? pipeline(src, zlib.createGunzip(), child.stdin!) : pipeline(src, child.stdin!), done]);
  } finally {
    opts.remove();
  }
}
