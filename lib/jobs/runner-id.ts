import os from "node:os";

// Process start time makes the id unique even when a restarted server gets the same pid (containers).
const BOOT_MS = Math.round(Date.now() - process.uptime() * 1000);

/** Names the process that owns a run's job: "host:pid:start-ms". */
export const RUNNER_ID = `${os.hostname()}:${process.pid}:${BOOT_MS}`;

/** Whether the process named by a runner id may still be alive (false when it surely is not). */
export function runnerMayBeAlive(runner: string | null): boolean {
  if (!runner) return false;
  const m = /^(.*):(\d+):(\d+)$/.exec(runner);
  if (!m) return false;
  const [, host, pidText] = m;
  if (runner === RUNNER_ID) return true;
  // Another machine: we cannot tell, so leave its runs alone.
  if (host !== os.hostname()) return true;
  const pid = Number(pidText);
  if (pid === process.pid) return false; // our pid, but an earlier start time: a previous process
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === "EPERM";
  }
}
