import { createHash } from "node:crypto";
import { Op } from "sequelize";
import { getModels } from "@/models";

/** At most `limit` counted events per `windowMs`, per key. */
export interface RateRule {
  bucket: string;
  limit: number;
  windowMs: number;
}

export interface RateDecision {
  allowed: boolean;
  /** Seconds until the oldest counted event leaves the window (0 when allowed). */
  retryAfterSeconds: number;
  remaining: number;
}

const MINUTE = 60_000;

// Failed sign-ins. The lockout is per (account, address) pair, so wrong passwords sent from other
// addresses (or with a forged X-Forwarded-For) never lock the real user out; the wider per-address limit,
// on the address the request really came from, caps guessing across accounts and across forged pairs.
export const SIGN_IN_PER_PAIR: RateRule = { bucket: "signin:pair", limit: 5, windowMs: 15 * MINUTE };
export const SIGN_IN_PER_IP: RateRule = { bucket: "signin:ip", limit: 30, windowMs: 15 * MINUTE };
// Wrong current passwords when a signed-in user changes theirs (the account is known, the session proves it).
export const SIGN_IN_PER_ACCOUNT: RateRule = { bucket: "signin:account", limit: 5, windowMs: 15 * MINUTE };
// Reset e-mails: enough for a typo or two, not enough to flood someone's inbox.
export const RESET_PER_ACCOUNT: RateRule = { bucket: "reset:account", limit: 3, windowMs: 60 * MINUTE };
export const RESET_PER_IP: RateRule = { bucket: "reset:ip", limit: 20, windowMs: 60 * MINUTE };

/** Pure decision from the times of counted events (any order). */
export function decide(hits: readonly Date[], now: Date, rule: RateRule): RateDecision {
  const since = now.getTime() - rule.windowMs;
  const inWindow = hits.map((h) => h.getTime()).filter((t) => t > since).sort((a, b) => a - b);
  if (inWindow.length < rule.limit) {
    return { allowed: true, retryAfterSeconds: 0, remaining: rule.limit - inWindow.length };
  }
  // The window frees a slot when the (count - limit + 1)-th oldest event ages out.
  const freesAt = inWindow[inWindow.length - rule.limit] + rule.windowMs;
  return { allowed: false, retryAfterSeconds: Math.max(1, Math.ceil((freesAt - now.getTime()) / 1000)), remaining: 0 };
}

/** Where counted events live. The database store is the real one; the memory store serves unit tests. */
export interface RateStore {
  hitsSince(bucket: string, key: string, since: Date): Promise<Date[]>;
  add(bucket: string, key: string, at: Date): Promise<void>;
  clear(bucket: string, key: string): Promise<void>;
  /** Drops every key of `bucket` that starts with `prefix`. */
  clearPrefix(bucket: string, prefix: string): Promise<void>;
  prune(before: Date): Promise<void>;
}

export class MemoryRateStore implements RateStore {
  private hits = new Map<string, Date[]>();
  async hitsSince(bucket: string, key: string, since: Date) {
    return (this.hits.get(`${bucket}\u0000${key}`) ?? []).filter((d) => d > since);
  }
  async add(bucket: string, key: string, at: Date) {
    const k = `${bucket}\u0000${key}`;
    this.hits.set(k, [...(this.hits.get(k) ?? []), at]);
  }
  async clear(bucket: string, key: string) {
    this.hits.delete(`${bucket}\u0000${key}`);
  }
  async clearPrefix(bucket: string, prefix: string) {
    for (const k of [...this.hits.keys()]) if (k.startsWith(`${bucket}\u0000${prefix}`)) this.hits.delete(k);
  }
  async prune(before: Date) {
    for (const [k, v] of this.hits) this.hits.set(k, v.filter((d) => d >= before));
  }
}

/** Survives restarts and is shared by every app process using the same database. */
export class DbRateStore implements RateStore {
  async hitsSince(bucket: string, key: string, since: Date) {
    const rows = await getModels().RateLimitHit.findAll({
      where: { bucket, key, hitAt: { [Op.gt]: since } },
      attributes: ["hitAt"],
      order: [["hitAt", "ASC"]],
    });
    return rows.map((r) => r.hitAt);
  }
  async add(bucket: string, key: string, at: Date) {
    await getModels().RateLimitHit.create({ bucket, key, hitAt: at });
  }
  async clear(bucket: string, key: string) {
    await getModels().RateLimitHit.destroy({ where: { bucket, key } });
  }
  async clearPrefix(bucket: string, prefix: string) {
    await getModels().RateLimitHit.destroy({ where: { bucket, key: { [Op.like]: `${prefix.replace(/[\\%_]/g, (c) => `\\${c}`)}%` } } });
  }
  async prune(before: Date) {
    await getModels().RateLimitHit.destroy({ where: { hitAt: { [Op.lt]: before } } });
  }
}

export class RateLimiter {
  constructor(
    private readonly store: RateStore,
    private readonly now: () => Date = () => new Date(),
  ) {}

  async check(rule: RateRule, key: string): Promise<RateDecision> {
    const now = this.now();
    const hits = await this.store.hitsSince(rule.bucket, normaliseKey(key), new Date(now.getTime() - rule.windowMs));
    return decide(hits, now, rule);
  }

  /** The most restrictive decision over several rules (e.g. per account and per IP). */
  async checkAll(checks: ReadonlyArray<[RateRule, string]>): Promise<RateDecision> {
    const decisions = await Promise.all(checks.map(([rule, key]) => this.check(rule, key)));
    const blocked = decisions.filter((d) => !d.allowed);
    if (blocked.length) return blocked.reduce((a, b) => (a.retryAfterSeconds >= b.retryAfterSeconds ? a : b));
    return decisions.reduce((a, b) => (a.remaining <= b.remaining ? a : b), { allowed: true, retryAfterSeconds: 0, remaining: Infinity });
  }

  async hit(rule: RateRule, key: string): Promise<void> {
    const now = this.now();
    await this.store.add(rule.bucket, normaliseKey(key), now);
    // Keep the table small: drop events older than a day now and then.
    if (Math.random() < 0.02) await this.store.prune(new Date(now.getTime() - 24 * 60 * MINUTE));
  }

  async clear(rule: RateRule, key: string): Promise<void> {
    await this.store.clear(rule.bucket, normaliseKey(key));
  }

  async clearPrefix(rule: RateRule, prefix: string): Promise<void> {
    await this.store.clearPrefix(rule.bucket, normaliseKey(prefix));
  }
}

function normaliseKey(key: string): string {
  return key.trim().toLowerCase().slice(0, 254);
}

let shared: RateLimiter | undefined;
/** The process-wide limiter backed by the database. */
export function rateLimiter(): RateLimiter {
  shared ??= new RateLimiter(new DbRateStore());
  return shared;
}

/** The key prefix of every pair of one account (a digest, so long e-mails and addresses fit the column). */
export const accountPrefix = (email: string) => `${createHash("sha256").update(email.trim().toLowerCase()).digest("hex").slice(0, 32)}|`;
/** The key of an (account, address) pair. */
export const pairKey = (email: string, address: string) => `${accountPrefix(email)}${address.slice(0, 120)}`;
