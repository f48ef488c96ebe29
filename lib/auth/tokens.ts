// One-time e-mailed links (invitations, password resets): random tokens stored only as hashes, with lifetimes.
import { createHash, randomBytes } from "node:crypto";
import { Op, type Transaction } from "sequelize";
import { getModels } from "@/models";
import type { AuthToken, TokenPurpose } from "@/models/AuthToken";

const HOUR = 3_600_000;

/** How long an e-mailed link stays valid. */
export const TOKEN_LIFETIME_MS: Record<TokenPurpose, number> = {
  invite: 72 * HOUR,
  reset: 1 * HOUR,
};

/** 32 random bytes as URL-safe base64 (43 characters): the part that goes into the e-mailed link. */
export function generateToken(): string {
  return randomBytes(32).toString("base64url");
}

/** Only this hash is stored, so a leaked table cannot be turned back into working links. */
export function hashToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

export type TokenState = "usable" | "used" | "expired";

/** Why a stored token can or cannot be used at `now`. */
export function tokenState(row: Pick<AuthToken, "usedAt" | "expiresAt">, now: Date): TokenState {
  if (row.usedAt) return "used";
  if (row.expiresAt.getTime() <= now.getTime()) return "expired";
  return "usable";
}

export function expiryFor(purpose: TokenPurpose, now: Date): Date {
  return new Date(now.getTime() + TOKEN_LIFETIME_MS[purpose]);
}

/**
 * Issues a new one-time token for `userId`. Earlier unused tokens of the same purpose are retired,
 * so only the newest e-mailed link works.
 */
export async function issueToken(
  userId: number,
  purpose: TokenPurpose,
  opts: { createdByUserId?: number | null; now?: Date; transaction?: Transaction } = {},
): Promise<{ token: string; expiresAt: Date }> {
  const { AuthToken } = getModels();
  const now = opts.now ?? new Date();
  const token = generateToken();
  const expiresAt = expiryFor(purpose, now);
  await AuthToken.update(
    { usedAt: now },
    { where: { userId, purpose, usedAt: { [Op.is]: null } }, transaction: opts.transaction },
  );
  await AuthToken.create(
    { userId, purpose, tokenHash: hashToken(token), expiresAt, createdByUserId: opts.createdByUserId ?? null },
    { transaction: opts.transaction },
  );
  return { token, expiresAt };
}

/** Looks a token up without using it (to show the right form or message). */
export async function findToken(token: string, purpose: TokenPurpose, now = new Date()) {
  const { AuthToken, User } = getModels();
  const row = await AuthToken.findOne({
    where: { tokenHash: hashToken(token), purpose },
    include: [{ model: User, as: "user" }],
  });
  if (!row) return { state: "unknown" as const, row: null };
  return { state: tokenState(row, now), row };
}

/**
 * Marks the token used, atomically: of two concurrent requests with the same link only one wins.
 * Returns the user id, or null when the token is unknown, used or expired.
 */
export async function consumeToken(
  token: string,
  purpose: TokenPurpose,
  transaction: Transaction,
  now = new Date(),
): Promise<number | null> {
  const { AuthToken } = getModels();
  const tokenHash = hashToken(token);
  const [count] = await AuthToken.update(
    { usedAt: now },
    { where: { tokenHash, purpose, usedAt: { [Op.is]: null }, expiresAt: { [Op.gt]: now } }, transaction },
  );
  if (count !== 1) return null;
  const row = await AuthToken.findOne({ where: { tokenHash }, transaction });
  return row?.userId ?? null;
}
