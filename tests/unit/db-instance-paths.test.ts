import { describe, expect, it } from "vitest";
import { dataDirFromEnv, defaultDataDir, instancePaths, socketPathFor, sqlString } from "@/scripts/lib/instance-paths";

describe("socket naming", () => {
  it("stays far below the 107-byte Unix socket limit even for a very deep checkout", () => {
    const deep = "/" + Array.from({ length: 40 }, (_, i) => `folder-number-${i}`).join("/") + "/.data/test-3308";
    expect(deep.length).toBeGreaterThan(500);
    const sock = socketPathFor(deep);
    expect(Buffer.byteLength(sock)).toBeLessThan(107);
    expect(sock.startsWith("/tmp/tautline-db-")).toBe(true);
  });

  it("is stable for one data dir and differs between data dirs", () => {
    expect(socketPathFor("/a/.data/demo")).toBe(socketPathFor("/a/.data/demo"));
    expect(socketPathFor("/a/.data/demo")).not.toBe(socketPathFor("/b/.data/demo"));
    expect(socketPathFor("/a/.data/demo")).not.toBe(socketPathFor("/a/.data/test-3308"));
  });

  it("keeps pid and log inside the data dir, with absolute paths", () => {
    const p = instancePaths("relative/dir");
    expect(p.dataDir.startsWith("/")).toBe(true);
    expect(p.logFile).toBe(`${p.dataDir}/mariadbd.log`);
    expect(p.pidFile).toBe(`${p.dataDir}/mariadbd.pid`);
    expect(p.socket).toBe(socketPathFor(p.dataDir));
  });
});

describe("data dirs", () => {
  it("gives the default port .data/demo, other ports their own folder, tests test-<port>", () => {
    expect(defaultDataDir("/r", "demo", 3307)).toBe("/r/.data/demo");
    expect(defaultDataDir("/r", "demo", 3310)).toBe("/r/.data/demo-3310");
    expect(defaultDataDir("/r", "test", 3308)).toBe("/r/.data/test-3308");
  });

  it("lets DB_DATA_DIR override, relative to the repository", () => {
    expect(dataDirFromEnv("/r", { DB_DATA_DIR: "elsewhere/db" }, "demo", 3307)).toBe("/r/elsewhere/db");
    expect(dataDirFromEnv("/r", { DB_DATA_DIR: "/abs/db" }, "demo", 3307)).toBe("/abs/db");
    expect(dataDirFromEnv("/r", {}, "demo", 3307)).toBe("/r/.data/demo");
  });
});

describe("sqlString", () => {
  it("escapes quotes and backslashes for the CREATE USER password", () => {
    expect(sqlString("plain")).toBe("'plain'");
    expect(sqlString("it's")).toBe("'it\\'s'");
    expect(sqlString("a\\b")).toBe("'a\\\\b'");
  });
});
