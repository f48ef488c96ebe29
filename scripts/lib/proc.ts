// Child processes for the scripts: run and capture, run live, find a Debian binary.
import { spawn, type SpawnOptions } from "node:child_process";
import fs from "node:fs";

export interface RunResult {
  code: number;
  stdout: string;
  stderr: string;
}

/** Runs a command to completion, capturing its output (never throws on a non-zero exit). */
export function capture(
  cmd: string,
  args: string[],
  opts: { input?: string; env?: NodeJS.ProcessEnv; cwd?: string; timeoutMs?: number } = {},
): Promise<RunResult> {
  return new Promise((resolve) => {
    const child = spawn(cmd, args, { env: opts.env ?? process.env, cwd: opts.cwd, stdio: ["pipe", "pipe", "pipe"] });
    let stdout = "";
    let stderr = "";
    const timer = opts.timeoutMs ? setTimeout(() => child.kill("SIGKILL"), opts.timeoutMs) : undefined;
    child.stdout.on("data", (d) => (stdout += d));
    child.stderr.on("data", (d) => (stderr += d));
    child.on("error", (err) => {
      if (timer) clearTimeout(timer);
      resolve({ code: 127, stdout, stderr: stderr + String(err) });
    });
    child.on("close", (code) => {
      if (timer) clearTimeout(timer);
      resolve({ code: code ?? 1, stdout, stderr });
    });
    // A command that exits without reading its input closes the pipe: that is its answer, not an error here.
    child.stdin.on("error", () => {});
    child.stdin.end(opts.input ?? "");
  });
}

/** Runs a command with its output shown live; resolves with the exit code. */
export function runLive(cmd: string, args: string[], opts: SpawnOptions = {}): Promise<number> {
  return new Promise((resolve) => {
    const child = spawn(cmd, args, { stdio: "inherit", ...opts });
    child.on("error", (err) => {
      console.error(`could not run ${cmd}: ${err.message}`);
      resolve(127);
    });
    child.on("close", (code, signal) => resolve(code ?? (signal ? 128 + signalNumber(signal) : 1)));
  });
}

function signalNumber(signal: NodeJS.Signals): number {
  return signal === "SIGINT" ? 2 : signal === "SIGTERM" ? 15 : signal === "SIGKILL" ? 9 : 1;
}

/** First existing path among the usual places for a Debian binary, or null. */
export function findBinary(name: string): string | null {
  const dirs = [...(process.env.PATH ?? "").split(":"), "/usr/sbin", "/usr/bin", "/sbin", "/bin"];
  for (const dir of dirs) {
    if (!dir) continue;
    const p = `${dir}/${name}`;
    try {
      fs.accessSync(p, fs.constants.X_OK);
      return p;
    } catch {
      // not here
    }
  }
  return null;
}

export const sleep = (ms: number) => new Promise<void>((r) => setTimeout(r, ms));

/** Last lines of a text file (for error messages that show a server log). */
export function tail(file: string, lines = 25): string {
  try {
    const text = fs.readFileSync(file, "utf8");
    return text.trimEnd().split("\n").slice(-lines).join("\n");
  } catch {
    return `(no log at ${file})`;
  }
}
