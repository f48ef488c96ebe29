import http from "node:http";
import { describe, expect, it } from "vitest";
import { claimedAddress, clientAddress, installPeerStamp } from "@/lib/security/client-address";
import { decide, MemoryRateStore, RateLimiter, SIGN_IN_PER_ACCOUNT, type RateRule } from "@/lib/auth/rate-limit";

const MIN = 60_000;
const rule: RateRule = { bucket: "test", limit: 3, windowMs: 10 * MIN };

function clock(start: string) {
  let t = new Date(start).getTime();
  return { now: () => new Date(t), advance: (ms: number) => (t += ms) };
}

describe("decide", () => {
  const now = new Date("2026-05-01T10:00:00Z");
  const ago = (m: number) => new Date(now.getTime() - m * MIN);

  it("allows while fewer than `limit` events fall inside the window", () => {
    expect(decide([ago(1), ago(2)], now, rule)).toEqual({ allowed: true, retryAfterSeconds: 0, remaining: 1 });
    expect(decide([ago(11), ago(12), ago(13)], now, rule).allowed).toBe(true);
  });

  it("blocks at the limit and says when the oldest counted event leaves the window", () => {
    const d = decide([ago(1), ago(4), ago(2)], now, rule);
    expect(d.allowed).toBe(false);
    // The oldest event (4 min ago) leaves the 10 min window in 6 min.
    expect(d.retryAfterSeconds).toBe(6 * 60);
  });

  it("with more events than the limit, waits until enough have aged out", () => {
    const d = decide([ago(9), ago(8), ago(5), ago(1)], now, rule);
    // Four in the window, limit three: two must leave; the second oldest (8 min ago) leaves in 2 min.
    expect(d.retryAfterSeconds).toBe(2 * 60);
  });
});

describe("RateLimiter", () => {
  it("blocks the sixth failed sign-in on an account within 15 minutes and frees it after the window", async () => {
    const c = clock("2026-05-01T10:00:00Z");
    const limiter = new RateLimiter(new MemoryRateStore(), c.now);
    for (let i = 0; i < SIGN_IN_PER_ACCOUNT.limit; i++) {
      expect((await limiter.check(SIGN_IN_PER_ACCOUNT, "a@lanternfell.example")).allowed).toBe(true);
      await limiter.hit(SIGN_IN_PER_ACCOUNT, "a@lanternfell.example");
      c.advance(MIN);
    }
    const blocked = await limiter.check(SIGN_IN_PER_ACCOUNT, "A@Lanternfell.example ");
    expect(blocked.allowed).toBe(false);
    expect(blocked.retryAfterSeconds).toBe(10 * 60); // first failure at 0, now at 5 min, window 15 min
    expect((await limiter.check(SIGN_IN_PER_ACCOUNT, "b@lanternfell.example")).allowed).toBe(true);
    c.advance(10 * MIN + 1);
    expect((await limiter.check(SIGN_IN_PER_ACCOUNT, "a@lanternfell.example")).allowed).toBe(true);
  });

  it("clears an account's count (after a successful sign-in)", async () => {
    const limiter = new RateLimiter(new MemoryRateStore());
    for (let i = 0; i < 3; i++) await limiter.hit(rule, "k");
    expect((await limiter.check(rule, "k")).allowed).toBe(false);
    await limiter.clear(rule, "k");
    expect((await limiter.check(rule, "k")).allowed).toBe(true);
  });

  it("takes the strictest of several rules", async () => {
    const limiter = new RateLimiter(new MemoryRateStore());
    const wide: RateRule = { bucket: "wide", limit: 10, windowMs: 10 * MIN };
    for (let i = 0; i < 3; i++) await limiter.hit(rule, "acct");
    const d = await limiter.checkAll([
      [wide, "ip"],
      [rule, "acct"],
    ]);
    expect(d.allowed).toBe(false);
    const ok = await limiter.checkAll([
      [wide, "ip"],
      [rule, "other"],
    ]);
    expect(ok).toMatchObject({ allowed: true, remaining: 3 });
  });
});

describe("clientAddress", () => {
  it("ignores forwarding headers unless TRUSTED_PROXIES names the proxy", () => {
    const forged = new Headers({ "x-forwarded-for": "203.0.113.7, 198.51.100.20", "x-real-ip": "198.51.100.2" });
    // Without a stamped socket address and without a trusted proxy, every such request shares one key.
    expect(clientAddress(forged, {})).toBe("direct");
    expect(clientAddress(forged, { TRUSTED_PROXIES: "loopback" })).toBe("198.51.100.20");
    // Past our own proxies to the client they saw.
    expect(clientAddress(new Headers({ "x-forwarded-for": "198.51.100.20, 10.0.0.5" }), { TRUSTED_PROXIES: "10.0.0.5" })).toBe("198.51.100.20");
    expect(claimedAddress(forged, {})).toBe("198.51.100.20");
  });

  it("uses the socket's address, stamped at start-up, over anything the client sends", async () => {
    await installPeerStamp();
    const server = http.createServer((req, res) => {
      res.end(JSON.stringify({ address: clientAddress(req.headers, {}), viaProxy: clientAddress(req.headers, { TRUSTED_PROXIES: "loopback" }) }));
    });
    await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
    try {
      const { port } = server.address() as { port: number };
      const res = await fetch(`http://127.0.0.1:${port}/`, { headers: { "x-forwarded-for": "203.0.113.99" } });
      const body = (await res.json()) as { address: string; viaProxy: string };
      expect(body.address).toMatch(/^(::ffff:)?127\.0\.0\.1$/);
      expect(body.viaProxy).toBe("203.0.113.99");
    } finally {
      await new Promise((resolve) => server.close(resolve));
    }
  });
});
