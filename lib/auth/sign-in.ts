import { createHash } from "node:crypto";
import { QueryTypes } from "sequelize";
import { getSequelize } from "@/lib/db/sequelize";
import { unavailable } from "@/lib/http/errors";
import { getModels } from "@/models";
import { verifyPassword } from "./password";
import { pairKey, rateLimiter, SIGN_IN_PER_IP, SIGN_IN_PER_PAIR, type RateDecision } from "./rate-limit";
import { signInSchema } from "./schemas";
import { isRole, type Role } from "./roles";

export type SignInResult =
  | { ok: true; user: { id: number; email: string; name: string; role: Role; sessionVersion: number } }
  | { ok: false; reason: "invalid" | "rate-limited"; retryAfterSeconds?: number };

export const RATE_LIMITED_ERROR = "RateLimited";

/** Where a sign-in attempt comes from: the real address (limits) and the claimed one (the pair's lockout). */
export interface SignInOrigin {
  address: string;
  claimed?: string;
}

const origin = (from: string | SignInOrigin): Required<SignInOrigin> =>
  typeof from === "string" ? { address: from, claimed: from } : { address: from.address, claimed: from.claimed ?? from.address };

/** Whether this (account, address) pair or this address is already over its failed sign-in limit. */
export async function signInAllowed(email: string, from: string | SignInOrigin): Promise<RateDecision> {
  const o = origin(from);
  return rateLimiter().checkAll([
    [SIGN_IN_PER_PAIR, pairKey(email, o.claimed)],
    [SIGN_IN_PER_IP, o.address],
  ]);
}

/**
 * Checks credentials. Attempts from one address run one at a time (a lock in this process and a named
 * lock in MariaDB shared by every process), so a burst of parallel guesses is counted guess by guess and
 * only the first few reach the password check. Failures count against the (account, address) pair and
 * the address. A success clears nothing: failures age out of their window, so a right password at the end
 * of a burst does not buy the burst more guesses. Unknown e-mail, wrong password and inactive account
 * look the same to the caller.
 */
export async function checkCredentials(raw: unknown, from: string | SignInOrigin): Promise<SignInResult> {
  const parsed = signInSchema.safeParse(raw);
  if (!parsed.success) return { ok: false, reason: "invalid" };
  const { email, password } = parsed.data;
  const o = origin(from);
  return oneAtATime(o.address, async () => {
    const limit = await signInAllowed(email, o);
    if (!limit.allowed) return { ok: false, reason: "rate-limited", retryAfterSeconds: limit.retryAfterSeconds };

    const { User } = getModels();
    const user = await User.findOne({ where: { email } });
    // Compare against a hash even for unknown users so timing does not tell which e-mails exist.
    const good = await verifyPassword(password, user?.passwordHash ?? UNUSABLE_HASH);
    if (!user || !good || !user.active || !user.passwordHash || !isRole(user.role)) {
      await rateLimiter().hit(SIGN_IN_PER_PAIR, pairKey(email, o.claimed));
      await rateLimiter().hit(SIGN_IN_PER_IP, o.address);
      return { ok: false, reason: "invalid" };
    }
    await user.update({ lastSignInAt: new Date() });
    return {
      ok: true,
      user: { id: user.id, email: user.email, name: user.name, role: user.role, sessionVersion: user.sessionVersion },
    };
  });
}

// Attempts waiting per address in this process: each runs after the previous one finished.
const queues = new Map<string, Promise<unknown>>();
const LOCK_WAIT_SECONDS = 10;

async function oneAtATime<T>(address: string, fn: () => Promise<T>): Promise<T> {
  const previous = queues.get(address) ?? Promise.resolve();
  const mine = previous.catch(() => undefined).then(() => withNamedLock(`tl:signin:${digest(address)}`, fn));
  queues.set(address, mine);
  try {
    return await mine;
  } finally {
    if (queues.get(address) === mine) queues.delete(address);
  }
}

/** Runs `fn` holding a MariaDB named lock, so processes sharing the database take turns too. */
async function withNamedLock<T>(name: string, fn: () => Promise<T>): Promise<T> {
  const sequelize = getSequelize();
  return sequelize.transaction(async (transaction) => {
    const [row] = await sequelize.query<{ got: number | null }>("SELECT GET_LOCK(?, ?) AS got", {
      replacements: [name, LOCK_WAIT_SECONDS],
      type: QueryTypes.SELECT,
      transaction,
    });
    if (Number(row?.got) !== 1) throw unavailable("Sign-in is busy. Try again in a few seconds.");
    try {
      return await fn();
    } finally {
      await sequelize.query("SELECT RELEASE_LOCK(?)", { replacements: [name], type: QueryTypes.SELECT, transaction });
    }
  });
}

const digest = (s: string) => createHash("sha256").update(s).digest("hex").slice(0, 40);

// A bcrypt hash of a random string nobody knows (cost 11, same as real hashes).
const UNUSABLE_HASH = "$2b$11$GVQxktJPI7uajSL5R0/WjuxtcsbT6caWBsrW9M5BdsLtFmw1kbN8S";
