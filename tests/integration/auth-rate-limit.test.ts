import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD, demoAccount } from "@/lib/auth/demo-accounts";
import { DbRateStore, RateLimiter, SIGN_IN_PER_ACCOUNT, SIGN_IN_PER_IP } from "@/lib/auth/rate-limit";
import { checkCredentials } from "@/lib/auth/sign-in";
import { getModels } from "@/models";
import { authWorld } from "./auth-fixtures";

let world: Awaited<ReturnType<typeof authWorld>>;

beforeAll(async () => {
  world = await authWorld("authrl");
});

afterAll(async () => {
  await world?.close();
});

describe("sign-in rate limit (MariaDB)", () => {
  it("blocks an account after five failures, even with the right password, and a success clears it", async () => {
    const email = demoAccount("operator").email;
    for (let i = 0; i < SIGN_IN_PER_ACCOUNT.limit; i++) {
      const r = await checkCredentials({ email, password: `wrong-${i}` }, `10.9.0.${i}`);
      expect(r).toEqual({ ok: false, reason: "invalid" });
    }
    const blocked = await checkCredentials({ email, password: DEMO_PASSWORD }, "10.9.1.1");
    expect(blocked.ok).toBe(false);
    expect(blocked).toMatchObject({ reason: "rate-limited" });
    expect((blocked as { retryAfterSeconds: number }).retryAfterSeconds).toBeGreaterThan(14 * 60);

    // Once the oldest failures age out of the window, the right password works and clears the count.
    await getModels().RateLimitHit.update(
      { hitAt: new Date(Date.now() - SIGN_IN_PER_ACCOUNT.windowMs - 1000) },
      { where: { bucket: SIGN_IN_PER_ACCOUNT.bucket } },
    );
    expect((await checkCredentials({ email, password: DEMO_PASSWORD }, "10.9.1.1")).ok).toBe(true);
    expect(await getModels().RateLimitHit.count({ where: { bucket: SIGN_IN_PER_ACCOUNT.bucket, key: email } })).toBe(0);
  });

  it("blocks an address spraying many accounts, and the count is shared by every process", async () => {
    const ip = "192.0.2.77";
    const a = new RateLimiter(new DbRateStore());
    const b = new RateLimiter(new DbRateStore());
    for (let i = 0; i < SIGN_IN_PER_IP.limit; i++) await (i % 2 ? a : b).hit(SIGN_IN_PER_IP, ip);
    expect((await a.check(SIGN_IN_PER_IP, ip)).allowed).toBe(false);
    const r = await checkCredentials({ email: demoAccount("viewer").email, password: DEMO_PASSWORD }, ip);
    expect(r).toMatchObject({ ok: false, reason: "rate-limited" });
    expect((await checkCredentials({ email: demoAccount("viewer").email, password: DEMO_PASSWORD }, "192.0.2.78")).ok).toBe(true);
  });

  it("counts unknown accounts too, so guessing e-mails gains nothing", async () => {
    const ip = "192.0.2.90";
    const r = await checkCredentials({ email: "ghost@lanternfell.example", password: "whatever-123" }, ip);
    expect(r).toEqual({ ok: false, reason: "invalid" });
    expect(await getModels().RateLimitHit.count({ where: { key: "ghost@lanternfell.example" } })).toBe(1);
    expect(await getModels().RateLimitHit.count({ where: { key: ip } })).toBe(1);
  });
});
