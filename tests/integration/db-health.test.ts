import net from "node:net";
import { afterAll, describe, expect, it } from "vitest";
import type { Sequelize } from "sequelize";
import { dbConfig } from "@/lib/db/config";
import { createSequelize } from "@/lib/db/sequelize";
import { checkDatabase, dbHttpError, DatabaseUnavailableError, isDbConnectionError, withDatabase } from "@/lib/db/health";
import { HttpError } from "@/lib/http/errors";

/** A loopback port nobody listens on: bind to 0, note the port, close. */
async function closedPort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
  const port = (server.address() as net.AddressInfo).port;
  await new Promise<void>((r) => server.close(() => r()));
  return port;
}

const opened: Sequelize[] = [];
afterAll(async () => {
  await Promise.all(opened.map((s) => s.close()));
});

function open(overrides: Partial<ReturnType<typeof dbConfig>>) {
  const c = { ...dbConfig(), ...overrides };
  const s = createSequelize(c);
  opened.push(s);
  return { c, s };
}

describe("an unreachable database", () => {
  it("gives a clear error naming host:port and how to start it", async () => {
    const port = await closedPort();
    const { c, s } = open({ port });
    const err = await checkDatabase(s, c).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(DatabaseUnavailableError);
    const message = (err as Error).message;
    expect(message).toContain(`127.0.0.1:${port}`);
    expect(message).toContain("connection refused");
    expect(message).toContain("npm run db:start");
  });

  it("becomes HTTP 503 with Retry-After in API code", async () => {
    const port = await closedPort();
    const { c, s } = open({ port });
    const err = await withDatabase(() => s.query("SELECT 1")).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(HttpError);
    expect((err as HttpError).status).toBe(503);
    expect((err as HttpError).headers["Retry-After"]).toBeDefined();
    const direct = await s.query("SELECT 1").catch((e: unknown) => e);
    expect(isDbConnectionError(direct)).toBe(true);
    expect((dbHttpError(direct, c) as HttpError).message).toContain(`127.0.0.1:${port}`);
  });

  it("says when the password is refused", async () => {
    const { c, s } = open({ password: "not-the-password" });
    const err = await checkDatabase(s, c).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(DatabaseUnavailableError);
    expect((err as Error).message).toContain("DB_USER / DB_PASSWORD");
  });
});

describe("a reachable database", () => {
  it("passes the check, and a bad query stays a query error (not a 503)", async () => {
    const { c, s } = open({});
    await expect(checkDatabase(s, c)).resolves.toBeUndefined();
    const err = await s.query("SELECT * FROM no_such_table_here").catch((e: unknown) => e);
    expect(isDbConnectionError(err)).toBe(false);
    expect(dbHttpError(err)).toBe(err);
  });
});
