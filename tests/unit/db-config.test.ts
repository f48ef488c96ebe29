import { describe, expect, it } from "vitest";
import { ConfigError, dbConfig, dbTarget, parsePort } from "@/lib/db/config";
import { demoStack, testStack, stackEnv } from "@/scripts/lib/settings";

describe("dbConfig", () => {
  it("uses the private loopback instance when nothing is set", () => {
    const c = dbConfig({});
    expect(c).toEqual({ host: "127.0.0.1", port: 3307, database: "tautline", user: "tautline", password: "tautline-local", poolMax: 10 });
    expect(dbTarget(c)).toBe("127.0.0.1:3307");
  });

  it("reads every DB_* setting", () => {
    const c = dbConfig({ DB_HOST: "db.internal", DB_PORT: "3399", DB_NAME: "tl_x", DB_USER: "app_1", DB_PASSWORD: "p'w\\", DB_POOL_MAX: "4" });
    expect(c).toEqual({ host: "db.internal", port: 3399, database: "tl_x", user: "app_1", password: "p'w\\", poolMax: 4 });
  });

  it("treats empty values as unset", () => {
    expect(dbConfig({ DB_PORT: "", DB_NAME: " ", DB_HOST: "" })).toMatchObject({ port: 3307, database: "tautline", host: "127.0.0.1" });
  });

  it("rejects a port that is not a port, naming the variable", () => {
    for (const bad of ["abc", "0", "65536", "33.5", "-1"]) {
      expect(() => dbConfig({ DB_PORT: bad })).toThrow(ConfigError);
      expect(() => dbConfig({ DB_PORT: bad })).toThrow(/DB_PORT/);
    }
  });

  it("rejects names that would not be plain SQL identifiers", () => {
    expect(() => dbConfig({ DB_NAME: "tautline; drop" })).toThrow(/DB_NAME/);
    expect(() => dbConfig({ DB_USER: "a`b" })).toThrow(/DB_USER/);
    expect(() => dbConfig({ DB_POOL_MAX: "0" })).toThrow(/DB_POOL_MAX/);
  });
});

describe("parsePort", () => {
  it("accepts 1–65535 and trims", () => {
    expect(parsePort(" 3308 ", "X", 1)).toBe(3308);
    expect(parsePort("1", "X", 9)).toBe(1);
    expect(parsePort("65535", "X", 9)).toBe(65535);
    expect(parsePort(undefined, "X", 9)).toBe(9);
  });
});

describe("stacks", () => {
  it("keeps the test stack off the demo ports and data", () => {
    const demo = demoStack({ NEXTAUTH_SECRET: "x".repeat(40) });
    const test = testStack({});
    expect(demo.db.port).toBe(3307);
    expect(demo.appPort).toBe(3000);
    expect(demo.appUrl).toBe("http://localhost:3000");
    expect(demo.smtpUrl).toBe("smtp://127.0.0.1:2525");
    expect(demo.mailFakeUrl).toBe("http://127.0.0.1:1080");
    expect(test.db.port).toBe(3308);
    expect(test.appPort).toBe(3100);
    expect(test.smtpUrl).toBe("smtp://127.0.0.1:2526");
    expect(test.mailFakeUrl).toBe("http://127.0.0.1:1081");
    expect(test.dataDir).not.toBe(demo.dataDir);
    expect(test.dataDir.endsWith("/.data/test-3308")).toBe(true);
  });

  it("ignores DB_PORT for tests: only TEST_DB_PORT moves the test database", () => {
    expect(testStack({ DB_PORT: "3307" }).db.port).toBe(3308);
    expect(testStack({ TEST_DB_PORT: "3444", TEST_APP_PORT: "3555" })).toMatchObject({ db: { port: 3444 }, appPort: 3555 });
  });

  it("does not start the mail fake when SMTP_URL names a real provider", () => {
    const s = demoStack({ SMTP_URL: "smtp://mail.provider.example:587", NEXTAUTH_SECRET: "x".repeat(40) });
    expect(s.runMailFake).toBe(false);
    expect(demoStack({ NEXTAUTH_SECRET: "x".repeat(40) }).runMailFake).toBe(true);
  });

  it("hands every setting to the child processes", () => {
    const env = stackEnv(testStack({}), {});
    expect(env).toMatchObject({ DB_PORT: "3308", PORT: "3100", NEXTAUTH_URL: "http://127.0.0.1:3100", SMTP_URL: "smtp://127.0.0.1:2526" });
    expect(env.NEXTAUTH_SECRET?.length).toBeGreaterThanOrEqual(32);
  });
});
