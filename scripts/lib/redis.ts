import fs from "node:fs";
import net from "node:net";
import path from "node:path";
import { ensureDebianPackages, type DebianNeed } from "./debian";
import type { Lifecycle } from "./lifecycle";
import { stopChild } from "./lifecycle";
import { findBinary, sleep } from "./proc";
import { say } from "./log";

export const REDIS: DebianNeed = { pkg: "redis-server", binaries: ["redis-server"] };

/** Answers true when a Redis server answers PING on host:port. */
export function redisAnswers(port: number, host = "127.0.0.1", timeoutMs = 500): Promise<boolean> {
  return new Promise((resolve) => {
    const sock = net.connect({ port, host });
    const done = (ok: boolean) => {
      sock.destroy();
      resolve(ok);
    };
    sock.setTimeout(timeoutMs, () => done(false));
    sock.on("error", () => done(false));
    sock.on("connect", () => sock.write("PING\r\n"));
    sock.on("data", (d) => done(d.toString().startsWith("+PONG")));
  });
}

/**
 * Debian's redis-server on loopback for the queue mode (installed with apt-get when missing). A server
 * already answering on the port is reused and left running; one we start is stopped with the command.
 * No persistence: the queue lives as long as the command (jobs are also rows in MariaDB).
 */
export async function bringUpRedis(port: number, dir: string, life: Lifecycle): Promise<void> {
  if (await redisAnswers(port)) {
    say(`Redis already answers on 127.0.0.1:${port}: using it`);
    return;
  }
  await ensureDebianPackages([REDIS]);
  fs.mkdirSync(dir, { recursive: true });
  const bin = findBinary("redis-server") ?? "redis-server";
  const log = path.join(dir, "redis.log");
  const child = life.spawn(
    bin,
    ["--port", String(port), "--bind", "127.0.0.1", "--save", "", "--appendonly", "no", "--dir", dir, "--logfile", log, "--daemonize", "no"],
    { stdio: ["ignore", "ignore", "inherit"] },
  );
  life.onStop("Redis", async () => {
    say("stopping Redis");
    await stopChild(child);
  });
  const until = Date.now() + 10_000;
  while (!(await redisAnswers(port))) {
    if (child.exitCode !== null) throw new Error(`redis-server exited (code ${child.exitCode}); see ${log}`);
    if (Date.now() > until) throw new Error(`redis-server did not answer on 127.0.0.1:${port} within 10 s; see ${log}`);
    await sleep(100);
  }
  say(`Redis on 127.0.0.1:${port}`);
}

/** The loopback port of a redis:// URL, or null when it points at another host (then nothing is started). */
export function loopbackRedisPort(url: string): number | null {
  try {
    const u = new URL(url);
    if (!["127.0.0.1", "localhost", "[::1]"].includes(u.hostname)) return null;
    return Number(u.port || 6379);
  } catch {
    return null;
  }
}
