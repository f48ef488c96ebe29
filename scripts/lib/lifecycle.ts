import { spawn, type ChildProcess, type SpawnOptions } from "node:child_process";
import fs from "node:fs";
import { errorMessage, say, warn } from "./log";

/**
 * Keeps what a command started (child processes, servers, the database) and stops it in reverse
 * order exactly once: on a normal end, on a failure, and on Ctrl-C / SIGTERM / SIGHUP.
 */
export class Lifecycle {
  private stoppers: { name: string; stop: () => Promise<unknown> }[] = [];
  private stopping: Promise<void> | null = null;
  private children = new Set<ChildProcess>();
  /** Set once a signal arrived: long steps check it to avoid starting new work. */
  interrupted = false;
  private interruptedAt = 0;

  constructor() {
    for (const sig of ["SIGINT", "SIGTERM", "SIGHUP"] as const) {
      process.on(sig, () => {
        if (this.interrupted) {
          // One Ctrl-C arrives several times (terminal group, npm and tsx each pass it on): only a
          // signal well after the first one means "stop now".
          if (Date.now() - this.interruptedAt < 3_000) return;
          warn(`${sig} again: stopping without waiting (a database left running stops with npm run db:stop)`);
          for (const c of this.children) c.kill("SIGKILL");
          process.exit(130);
        }
        this.interrupted = true;
        this.interruptedAt = Date.now();
        say(`${sig} received: stopping`);
        void this.stop().then(() => process.exit(sig === "SIGINT" ? 130 : 143));
      });
    }
  }

  /**
   * `kill <npm pid>` ends npm and the `sh -c` it runs, but the signal never reaches us (we run under
   * tsx below that shell). So watch the process above tsx: once it is gone, stop as for SIGTERM.
   */
  watchLauncher(): void {
    const launcher = parentOf(process.ppid);
    if (!launcher || launcher <= 1) return;
    const timer = setInterval(() => {
      if (this.interrupted) return clearInterval(timer);
      if (parentOf(process.ppid) !== launcher) {
        clearInterval(timer);
        this.interrupted = true;
        this.interruptedAt = Date.now();
        say("the launching process ended: stopping");
        void this.stop().then(() => process.exit(143));
      }
    }, 1_000);
    timer.unref();
  }

  onStop(name: string, stop: () => Promise<unknown>): void {
    this.stoppers.push({ name, stop });
  }

  /** Spawns a child in our process group (a terminal Ctrl-C reaches it too) and stops it on exit. */
  spawn(cmd: string, args: string[], opts: SpawnOptions = {}): ChildProcess {
    const child = spawn(cmd, args, { stdio: "inherit", ...opts });
    this.children.add(child);
    child.on("exit", () => this.children.delete(child));
    return child;
  }

  /** Runs a child to completion; resolves with its exit code (128+n when killed by a signal). */
  run(cmd: string, args: string[], opts: SpawnOptions = {}): Promise<number> {
    if (this.interrupted) return Promise.resolve(130);
    return new Promise((resolve) => {
      const child = this.spawn(cmd, args, opts);
      child.on("error", (err) => {
        warn(`could not run ${cmd}: ${err.message}`);
        resolve(127);
      });
      child.on("exit", (code, signal) => resolve(code ?? (signal === "SIGINT" ? 130 : signal ? 143 : 1)));
    });
  }

  stop(): Promise<void> {
    if (!this.stopping) this.stopping = this.stopAll();
    return this.stopping;
  }

  private async stopAll(): Promise<void> {
    await Promise.all([...this.children].map((c) => stopChild(c)));
    for (const s of this.stoppers.reverse()) {
      try {
        await s.stop();
      } catch (err) {
        warn(`stopping ${s.name}: ${errorMessage(err)}`);
      }
    }
    const any = this.stoppers.length > 0;
    this.stoppers = [];
    if (any) say("stopped");
  }
}

/** SIGTERM, then SIGKILL after a grace period. */
export function stopChild(child: ChildProcess, graceMs = 10_000): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve();
  return new Promise((resolve) => {
    const timer = setTimeout(() => child.kill("SIGKILL"), graceMs);
    child.once("exit", () => {
      clearTimeout(timer);
      resolve();
    });
    child.kill("SIGTERM");
  });
}

/** Parent pid of a process from /proc (null when it is gone). */
function parentOf(pid: number): number | null {
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, "utf8");
    return Number(stat.slice(stat.lastIndexOf(")") + 2).split(" ")[1]);
  } catch {
    return null;
  }
}
