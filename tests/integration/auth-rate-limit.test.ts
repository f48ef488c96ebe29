import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD, demoAccount } from "@/lib/auth/demo-accounts";
import { DbRateStore, pairKey, RateLimiter, SIGN_IN_PER_IP, SIGN_IN_PER_PAIR } from "@/lib/auth/rate-limit";
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

const reasons = (results: Awaited<ReturnType<typeof checkCredentials>>[]) =>
  results.map((r) => (r.ok ? "ok" : r.reason)).reduce<Record<string, number>>((acc, k) => ({ ...acc, [k]: (acc[k] ?? 0) + 1 }), {});

describe("sign-in rate limit (MariaDB)", () => {
  it("counts a burst of parallel wrong passwords one by one: only the limit reaches the password check", async () => {
    const email = demoAccount("operator").email;
    const from = { address: "10.9.0.1", claimed: "10.9.0.1" };
    const burst = await Promise.all(Array.from({ length: 40 }, (_, i) => checkCredentials({ email, password: `wrong-${i}` }, from)));
    expect(reasons(burst)).toEqual({ invalid: SIGN_IN_PER_PAIR.limit, "rate-limited": 40 - SIGN_IN_PER_PAIR.limit });

    // The right password at the end of the burst is refused too, and does not reset the burst's count.
    const last = await checkCredentials({ email, password: DEMO_PASSWORD }, from);
    expect(last).toMatchObject({ ok: false, reason: "rate-limited" });
    expect((last as { retryAfterSeconds: number }).retryAfterSeconds).toBeGreaterThan(14 * 60);
    expect(await getModels().RateLimitHit.count({ where: { bucket: SIGN_IN_PER_PAIR.bucket, key: pairKey(email, "10.9.0.1") } })).toBe(
      SIGN_IN_PER_PAIR.limit,
    );

    // Once the failures age out of the window, the right password works.
    await getModels().RateLimitHit.update({ hitAt: new Date(Date.now() - SIGN_IN_PER_PAIR.windowMs - 1000) }, { where: {} });
    expect((await checkCredentials({ email, password: DEMO_PASSWORD }, from)).ok).toBe(true);
  });

  it("wrong passwords from other (or forged) addresses do not lock the real user out", async () => {
    const email = demoAccount("engineer").email;
    for (let i = 0; i < SIGN_IN_PER_PAIR.limit + 2; i++) {
      // One real address forging a fresh X-Forwarded-For each time.
      const r = await checkCredentials({ email, password: `wrong-${i}` }, { address: "192.0.2.10", claimed: `203.0.113.${i}` });
      expect(r).toEqual({ ok: false, reason: "invalid" });
    }
    expect((await checkCredentials({ email, password: DEMO_PASSWORD }, { address: "198.51.100.4", claimed: "198.51.100.4" })).ok).toBe(true);
  });

  it("a fresh forged X-Forwarded-For per attempt does not escape the per-address limit", async () => {
    const email = demoAccount("trainer").email;
    const results = [];
    for (let i = 0; i < SIGN_IN_PER_IP.limit + 5; i++) {
      results.push(await checkCredentials({ email, password: `wrong-${i}` }, { address: "192.0.2.20", claimed: `198.18.${i}.1` }));
    }
    expect(reasons(results)).toEqual({ invalid: SIGN_IN_PER_IP.limit, "rate-limited": 5 });
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
    expect(await getModels().RateLimitHit.count({ where: { key: pairKey("ghost@lanternfell.example", ip) } })).toBe(1);
    expect(await getModels().RateLimitHit.count({ where: { key: ip } })).toBe(1);
  });
});
