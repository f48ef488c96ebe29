import type { Transaction } from "sequelize";
import { getSequelize } from "@/lib/db/sequelize";
import { badRequest, conflict, HttpError, notFound } from "@/lib/http/errors";
import { sendMail } from "@/lib/mail/send";
import { inviteElsewhereMail, inviteMail, passwordChangedMail, resetMail } from "@/lib/mail/templates";
import { getModels } from "@/models";
import type { CurrentUser } from "./current-user";
import { hashPassword, verifyPassword } from "./password";
import { accountPrefix, RESET_PER_ACCOUNT, RESET_PER_IP, SIGN_IN_PER_ACCOUNT, SIGN_IN_PER_PAIR, rateLimiter } from "./rate-limit";
import type { Role } from "./roles";
import { consumeToken, findToken, issueToken, TOKEN_LIFETIME_MS, type TokenState } from "./tokens";
import type {
  InviteUserInput,
  ProfileInput,
  UpdateUserInput,
} from "./schemas";

/** The address links in e-mails point at: APP_URL, else NEXTAUTH_URL, else the request's own origin. */
export function appBaseUrl(req: Request, env: Readonly<Record<string, string | undefined>> = process.env): string {
  const configured = env.APP_URL || env.NEXTAUTH_URL;
  return (configured || new URL(req.url).origin).replace(/\/+$/, "");
}

export type UserStatus = "active" | "invited" | "deactivated";

export interface UserSummary {
  id: number;
  email: string;
  name: string;
  role: Role;
  status: UserStatus;
  lastSignInAt: string | null;
  createdAt: string;
}

function summary(u: {
  id: number;
  email: string;
  name: string;
  role: Role;
  active: boolean;
  passwordHash: string | null;
  lastSignInAt?: Date | null;
  createdAt: Date;
}): UserSummary {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    role: u.role,
    status: !u.active ? "deactivated" : u.passwordHash ? "active" : "invited",
    lastSignInAt: u.lastSignInAt ? u.lastSignInAt.toISOString() : null,
    createdAt: u.createdAt.toISOString(),
  };
}

export async function listUsers(admin: CurrentUser): Promise<UserSummary[]> {
  const rows = await getModels().User.findAll({
    where: { organisationId: admin.organisationId },
    order: [["name", "ASC"]],
  });
  return rows.map(summary);
}

const mailFailed = (err: unknown) =>
  new HttpError(502, `Nothing was saved: ${(err as Error).message} Check SMTP_URL and try again.`);

/** What the inviting administrator is told: the same for a new address and for another organisation's. */
export interface InvitationSummary {
  email: string;
  name: string;
  role: Role;
  status: "invited";
}

/**
 * Creates an invited user (no password yet) and e-mails a one-time link. The mail is sent inside the
 * transaction, so when it fails nothing is stored and the admin can simply try again.
 *
 * An address that already belongs to another organisation gets the same answer as a new one (so an
 * administrator cannot learn which addresses have accounts elsewhere); nothing is stored, and the address's
 * owner gets a note that someone tried. An address already in the admin's own organisation answers 409:
 * the admin sees those users anyway.
 */
export async function inviteUser(admin: CurrentUser, input: InviteUserInput, baseUrl: string): Promise<InvitationSummary> {
  const { User, Organisation } = getModels();
  const answer: InvitationSummary = { email: input.email, name: input.name, role: input.role, status: "invited" };
  const existing = await User.findOne({ where: { email: input.email } });
  if (existing && existing.organisationId === admin.organisationId) throw alreadyInvited();
  const org = await Organisation.findByPk(admin.organisationId);
  const organisationName = org?.name ?? "your organisation";
  if (existing) {
    await sendMail(existing.email, inviteElsewhereMail({ inviterName: admin.name, organisationName })).catch((err) =>
      console.error("invitation notice:", (err as Error).message),
    );
    return answer;
  }
  const sequelize = getSequelize();
  try {
    return await sequelize.transaction(async (transaction) => {
      const user = await User.create(
        { email: input.email, name: input.name, role: input.role, organisationId: admin.organisationId, passwordHash: null },
        { transaction },
      );
      await sendInviteLink(admin, user, organisationName, baseUrl, transaction);
      return answer;
    });
  } catch (err) {
    // Two admins inviting the same address at once: the unique index decides.
    if ((err as Error).name === "SequelizeUniqueConstraintError") throw alreadyInvited();
    throw err;
  }
}

/** Issues a fresh invite token for `user` and mails its link; a failed mail fails the caller's transaction. */
async function sendInviteLink(
  admin: CurrentUser,
  user: { id: number; email: string; name: string; role: Role },
  organisationName: string,
  baseUrl: string,
  transaction: Transaction,
): Promise<void> {
  const { token } = await issueToken(user.id, "invite", { createdByUserId: admin.id, transaction });
  await sendMail(
    user.email,
    inviteMail({
      inviteeName: user.name,
      inviterName: admin.name,
      organisationName,
      role: user.role,
      link: `${baseUrl}/accept-invite?token=${token}`,
      validForMs: TOKEN_LIFETIME_MS.invite,
    }),
  ).catch((err) => {
    throw mailFailed(err);
  });
}

const alreadyInvited = () =>
  new HttpError(409, "This person is already a user of your organisation.", [
    { path: "email", message: "This person is already a user of your organisation." },
  ]);

/** Sends a fresh invite link to someone who has not accepted yet (older links stop working). */
export async function resendInvite(admin: CurrentUser, userId: number, baseUrl: string): Promise<UserSummary> {
  const { User, Organisation } = getModels();
  const user = await User.findOne({ where: { id: userId, organisationId: admin.organisationId } });
  if (!user) throw notFound("No such user in your organisation.");
  if (user.passwordHash) throw conflict("This person has already accepted the invitation.");
  if (!user.active) throw conflict("Reactivate this user before sending a new invitation.");
  const org = await Organisation.findByPk(admin.organisationId);
  return getSequelize().transaction(async (transaction) => {
    await sendInviteLink(admin, user, org?.name ?? "your organisation", baseUrl, transaction);
    return summary(user);
  });
}

const expiredLink = (what: string) =>
  badRequest(`This ${what} link has expired or was already used.`, [
    { path: "token", message: `This ${what} link has expired or was already used. Ask for a new one.` },
  ]);

/** The organisation's display name (the workspace frame, invitations); null when it is gone. */
export async function organisationName(organisationId: number): Promise<string | null> {
  return (await getModels().Organisation.findByPk(organisationId, { attributes: ["id", "name"] }))?.name ?? null;
}

/** What an invite link shows before it is used: whom it invites, where, as what; or why it cannot be used. */
export type InvitationLook =
  | { state: "usable"; email: string; name: string; role: string; organisationName: string | null }
  | { state: Exclude<TokenState, "usable"> | "unknown" };

/** Looks an invite link up without using it: an account that is deactivated or already has a password reads as used. */
export async function lookUpInvitation(token: string): Promise<InvitationLook> {
  const found = await findToken(token, "invite");
  const user = found.row?.get("user") as
    | { email: string; name: string; role: string; active: boolean; passwordHash: string | null; organisationId: number }
    | undefined;
  if (found.state !== "usable") return { state: found.state };
  if (!user?.active || user.passwordHash) return { state: "used" };
  return { state: "usable", email: user.email, name: user.name, role: user.role, organisationName: await organisationName(user.organisationId) };
}

/** Uses an invite link: sets the name and first password. The link works once. */
export async function acceptInvite(input: { token: string; name: string; password: string }): Promise<{ email: string }> {
  const { User } = getModels();
  const passwordHash = await hashPassword(input.password);
  return getSequelize().transaction(async (transaction) => {
    const userId = await consumeToken(input.token, "invite", transaction);
    if (!userId) throw expiredLink("invitation");
    const user = await User.findByPk(userId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!user || !user.active || user.passwordHash) throw expiredLink("invitation");
    await user.update({ name: input.name, passwordHash, sessionVersion: user.sessionVersion + 1 }, { transaction });
    return { email: user.email };
  });
}

export const FORGOT_PASSWORD_ANSWER =
  "If an active account uses this address, a reset link is on its way. It works once, within one hour.";

/**
 * Starts a password reset. The answer never says whether the address has an account; the e-mail goes
 * out in the background so the response time does not tell either. Returns false only when the
 * address (IP) is over its limit, which the caller answers with 429.
 */
export async function requestPasswordReset(
  email: string,
  ip: string,
  baseUrl: string,
): Promise<{ allowed: boolean; retryAfterSeconds: number; sent: Promise<void> }> {
  const limiter = rateLimiter();
  const byIp = await limiter.check(RESET_PER_IP, ip);
  if (!byIp.allowed) return { allowed: false, retryAfterSeconds: byIp.retryAfterSeconds, sent: Promise.resolve() };
  await limiter.hit(RESET_PER_IP, ip);
  const byAccount = await limiter.check(RESET_PER_ACCOUNT, email);
  if (!byAccount.allowed) return { allowed: true, retryAfterSeconds: 0, sent: Promise.resolve() };
  await limiter.hit(RESET_PER_ACCOUNT, email);

  const sent = (async () => {
    const user = await getModels().User.findOne({ where: { email } });
    if (!user || !user.active || !user.passwordHash) return;
    const { token } = await issueToken(user.id, "reset");
    await sendMail(
      user.email,
      resetMail({ name: user.name, link: `${baseUrl}/reset-password?token=${token}`, validForMs: TOKEN_LIFETIME_MS.reset }),
    );
  })().catch((err) => console.error("password reset e-mail:", (err as Error).message));
  return { allowed: true, retryAfterSeconds: 0, sent };
}

/** Uses a reset link: sets a new password and signs out every existing session. */
export async function resetPassword(input: { token: string; password: string }): Promise<{ email: string }> {
  const { User } = getModels();
  const passwordHash = await hashPassword(input.password);
  const result = await getSequelize().transaction(async (transaction) => {
    const userId = await consumeToken(input.token, "reset", transaction);
    if (!userId) throw expiredLink("reset");
    const user = await User.findByPk(userId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!user || !user.active) throw expiredLink("reset");
    await user.update({ passwordHash, sessionVersion: user.sessionVersion + 1 }, { transaction });
    return { email: user.email };
  });
  // Someone who proved they own the mailbox should not stay locked out by earlier failed guesses.
  await rateLimiter().clearPrefix(SIGN_IN_PER_PAIR, accountPrefix(result.email));
  return result;
}

/**
 * Changes one's own password after checking the current one. Every session, this one included, ends:
 * the form then asks to sign in again with the new password.
 */
export async function changeOwnPassword(
  me: CurrentUser,
  input: { currentPassword: string; newPassword: string },
): Promise<void> {
  const { User } = getModels();
  const limiter = rateLimiter();
  const limit = await limiter.check(SIGN_IN_PER_ACCOUNT, me.email);
  if (!limit.allowed) {
    throw new HttpError(429, "Too many wrong passwords. Try again later.", [], {
      "Retry-After": String(limit.retryAfterSeconds),
    });
  }
  const user = await User.findByPk(me.id);
  if (!user) throw notFound();
  if (!(await verifyPassword(input.currentPassword, user.passwordHash))) {
    await limiter.hit(SIGN_IN_PER_ACCOUNT, me.email);
    throw badRequest("The current password is not right.", [
      { path: "currentPassword", message: "The current password is not right." },
    ]);
  }
  await user.update({ passwordHash: await hashPassword(input.newPassword), sessionVersion: user.sessionVersion + 1 });
  await sendMail(user.email, passwordChangedMail({ name: user.name })).catch((err) =>
    console.error("password changed e-mail:", (err as Error).message),
  );
}

export async function updateOwnProfile(me: CurrentUser, input: ProfileInput): Promise<{ name: string; units: "si" | "us" }> {
  const user = await getModels().User.findByPk(me.id);
  if (!user) throw notFound();
  await user.update({ ...(input.name !== undefined && { name: input.name }), ...(input.units && { units: input.units }) });
  return { name: user.name, units: user.units };
}

/** A user of the admin's own organisation, or 404 (also for other organisations' users). */
export async function requireOrgUser(admin: CurrentUser, userId: number) {
  const user = await getModels().User.findOne({ where: { id: userId, organisationId: admin.organisationId } });
  if (!user) throw notFound("No such user in your organisation.");
  return user;
}

/** Changes another user's role or active state. An admin may not demote or deactivate themselves. */
export async function updateUser(admin: CurrentUser, userId: number, input: UpdateUserInput): Promise<UserSummary> {
  const user = await requireOrgUser(admin, userId);
  if (user.id === admin.id) {
    if (input.role !== undefined && input.role !== "admin") {
      throw badRequest("You cannot remove your own administrator role.", [
        { path: "role", message: "Ask another administrator to change your role." },
      ]);
    }
    if (input.active === false) {
      throw badRequest("You cannot deactivate your own account.", [
        { path: "active", message: "Ask another administrator to deactivate your account." },
      ]);
    }
  }
  const changes: Partial<{ role: Role; active: boolean; sessionVersion: number }> = {};
  if (input.role !== undefined) changes.role = input.role;
  if (input.active !== undefined && input.active !== user.active) {
    changes.active = input.active;
    // Deactivation ends sessions at once; reactivation must not revive old tokens either.
    changes.sessionVersion = user.sessionVersion + 1;
  }
  await user.update(changes);
  return summary(user);
}
