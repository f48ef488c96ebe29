import { describe, expect, it } from "vitest";
import { tokenSchema } from "@/lib/auth/schemas";
import { expiryFor, generateToken, hashToken, TOKEN_LIFETIME_MS, tokenState } from "@/lib/auth/tokens";

const HOUR = 3_600_000;

describe("one-time tokens", () => {
  it("are 32 random bytes in URL-safe base64 that the link schema accepts", () => {
    const seen = new Set<string>();
    for (let i = 0; i < 50; i++) {
      const t = generateToken();
      expect(t).toMatch(/^[A-Za-z0-9_-]{43}$/);
      expect(tokenSchema.safeParse(t).success).toBe(true);
      seen.add(t);
    }
    expect(seen.size).toBe(50);
  });

  it("are stored as a SHA-256 hash, never as themselves", () => {
    // Source: FIPS 180-4 test vector, SHA-256("abc").
    expect(hashToken("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    const t = generateToken();
    expect(hashToken(t)).toHaveLength(64);
    expect(hashToken(t)).not.toContain(t);
  });

  it("expire 72 hours (invite) and 1 hour (reset) after issue", () => {
    const now = new Date("2026-03-01T08:00:00Z");
    expect(TOKEN_LIFETIME_MS.invite).toBe(72 * HOUR);
    expect(TOKEN_LIFETIME_MS.reset).toBe(1 * HOUR);
    expect(expiryFor("invite", now).toISOString()).toBe("2026-03-04T08:00:00.000Z");
    expect(expiryFor("reset", now).toISOString()).toBe("2026-03-01T09:00:00.000Z");
  });

  it("are usable before expiry, expired at and after it, and used once used", () => {
    const issued = new Date("2026-03-01T08:00:00Z");
    const row = { usedAt: null, expiresAt: expiryFor("reset", issued) };
    expect(tokenState(row, new Date(issued.getTime() + 59 * 60_000))).toBe("usable");
    expect(tokenState(row, new Date(issued.getTime() + HOUR))).toBe("expired");
    expect(tokenState(row, new Date(issued.getTime() + 2 * HOUR))).toBe("expired");
    expect(tokenState({ ...row, usedAt: new Date(issued.getTime() + 60_000) }, issued)).toBe("used");
  });
});
