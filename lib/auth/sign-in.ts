import { getModels } from "@/models";
import { verifyPassword } from "./password";
import { rateLimiter, SIGN_IN_PER_ACCOUNT, SIGN_IN_PER_IP, type RateDecision } from "./rate-limit";
import { signInSchema } from "./schemas";
import { isRole, type Role } from "./roles";

export type SignInResult =
  | { ok: true; user: { id: number; email: string; name: string; role: Role; sessionVersion: number } }
  | { ok: false; reason: "invalid" | "rate-limited"; retryAfterSeconds?: number };

export const RATE_LIMITED_ERROR = "RateLimited";

/** Whether this account or address is already over its failed sign-in limit. */
export async function signInAllowed(email: string, ip: string): Promise<RateDecision> {
  return rateLimiter().checkAll([
    [SIGN_IN_PER_ACCOUNT, email],
    [SIGN_IN_PER_IP, ip],
  ]);
}

/**
 * Checks credentials. Failures count against the account and the address; a success clears the
 * account's count. Unknown e-mail, wrong password and inactive account look the same to the caller.
 */
export async function checkCredentials(raw: unknown, ip: string): Promise<SignInResult> {
  const parsed = signInSchema.safeParse(raw);
  if (!parsed.success) return { ok: false, reason: "invalid" };
  const { email, password } = parsed.data;

  const limit = await signInAllowed(email, ip);
  if (!limit.allowed) return { ok: false, reason: "rate-limited", retryAfterSeconds: limit.retryAfterSeconds };

  const { User } = getModels();
  const user = await User.findOne({ where: { email } });
  // Compare against a hash even for unknown users so timing does not tell which e-mails exist.
  const good = await verifyPassword(password, user?.passwordHash ?? UNUSABLE_HASH);
  if (!user || !good || !user.active || !user.passwordHash || !isRole(user.role)) {
    await rateLimiter().hit(SIGN_IN_PER_ACCOUNT, email);
    await rateLimiter().hit(SIGN_IN_PER_IP, ip);
    return { ok: false, reason: "invalid" };
  }
  await rateLimiter().clear(SIGN_IN_PER_ACCOUNT, email);
  await user.update({ lastSignInAt: new Date() });
  return {
    ok: true,
    user: { id: user.id, email: user.email, name: user.name, role: user.role, sessionVersion: user.sessionVersion },
  };
}

// A bcrypt hash of a random string nobody knows (cost 11, same as real hashes).
const UNUSABLE_HASH = "$2b$11$GVQxktJPI7uajSL5R0/WjuxtcsbT6caWBsrW9M5BdsLtFmw1kbN8S";
