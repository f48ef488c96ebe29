import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  acceptInvite,
  changeOwnPassword,
  inviteUser,
  requestPasswordReset,
  resendInvite,
  resetPassword,
  updateUser,
} from "@/lib/auth/accounts";
import { DEMO_ACCOUNTS, DEMO_PASSWORD, demoAccount } from "@/lib/auth/demo-accounts";
import { verifyPassword } from "@/lib/auth/password";
import { loadActiveUser, type CurrentUser } from "@/lib/auth/session";
import { checkCredentials } from "@/lib/auth/sign-in";
import { HttpError } from "@/lib/http/errors";
import { getModels } from "@/models";
import { authWorld, tokenFrom, waitFor } from "./auth-fixtures";

let world: Awaited<ReturnType<typeof authWorld>>;
let admin: CurrentUser;
let otherAdmin: CurrentUser;
const BASE = "http://127.0.0.1:3000";

async function asCurrent(email: string): Promise<CurrentUser> {
  const row = await getModels().User.findOne({ where: { email } });
  const u = await loadActiveUser(row!.id, row!.sessionVersion);
  if (!u) throw new Error(`${email} is not active`);
  return u;
}

async function rejects(p: Promise<unknown>): Promise<HttpError> {
  const err = await p.then(
    () => null,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(HttpError);
  return err as HttpError;
}

beforeAll(async () => {
  world = await authWorld("auth");
  admin = await asCurrent(demoAccount("admin").email);
  otherAdmin = await asCurrent(demoAccount("admin", "cardlevane").email);
});

afterAll(async () => {
  await world?.close();
});

describe("demo accounts", () => {
  it("exist once each with the shared demo password, even after seeding again", async () => {
    const { seedDemoAccounts } = await import("@/lib/auth/seed");
    await seedDemoAccounts(world.sequelize);
    const { User } = getModels();
    expect(await User.count()).toBe(DEMO_ACCOUNTS.length);
    for (const a of DEMO_ACCOUNTS) {
      const row = await User.findOne({ where: { email: a.email } });
      expect(row?.role).toBe(a.role);
      expect(await verifyPassword(DEMO_PASSWORD, row?.passwordHash)).toBe(true);
    }
  });
});

describe("invitations", () => {
  it("create an invited user, e-mail a link that works once, and set the chosen password", async () => {
    const summary = await inviteUser(admin, { email: "new.engineer@lanternfell.example", name: "Noor Halden", role: "engineer" }, BASE);
    expect(summary.status).toBe("invited");
    const mail = (await world.messages()).find((m) => m.to.includes("new.engineer@lanternfell.example"))!;
    expect(mail.subject).toContain("Lanternfell Park");
    expect(mail.text).toContain(`${BASE}/accept-invite?token=`);
    const token = tokenFrom(mail);

    // Nobody can sign in before the invitation is accepted.
    expect((await checkCredentials({ email: "new.engineer@lanternfell.example", password: "anything-at-all" }, "10.0.0.9")).ok).toBe(false);

    await acceptInvite({ token, name: "Noor Halden", password: "chain-dog-42" });
    const ok = await checkCredentials({ email: "new.engineer@lanternfell.example", password: "chain-dog-42" }, "10.0.0.9");
    expect(ok.ok).toBe(true);

    const again = await rejects(acceptInvite({ token, name: "Someone Else", password: "another-pass-1" }));
    expect(again.status).toBe(400);
    expect(again.issues[0].path).toBe("token");
    const row = await getModels().User.findOne({ where: { email: "new.engineer@lanternfell.example" } });
    expect(row?.name).toBe("Noor Halden");
    expect(await verifyPassword("chain-dog-42", row?.passwordHash)).toBe(true);
  });

  it("refuse an address that already has an account, storing nothing", async () => {
    const before = await getModels().User.count();
    const err = await rejects(inviteUser(admin, { email: demoAccount("viewer").email, name: "Dup", role: "viewer" }, BASE));
    expect(err.status).toBe(409);
    expect(err.issues[0].path).toBe("email");
    expect(await getModels().User.count()).toBe(before);
  });

  it("answer an address of another organisation exactly like a new one, store nothing, and tell the owner", async () => {
    const elsewhere = demoAccount("engineer", "cardlevane").email;
    const before = await getModels().User.count();
    const fresh = await inviteUser(admin, { email: "brand.new@lanternfell.example", name: "Ada Brenn", role: "viewer" }, BASE);
    const taken = await inviteUser(admin, { email: elsewhere, name: "Ada Brenn", role: "viewer" }, BASE);
    expect(Object.keys(taken).sort()).toEqual(Object.keys(fresh).sort());
    expect({ ...taken, email: "x" }).toEqual({ ...fresh, email: "x" });
    expect(await getModels().User.count()).toBe(before + 1);
    const owner = await getModels().User.findOne({ where: { email: elsewhere } });
    expect(owner?.organisationId).not.toBe(admin.organisationId);
    const notice = await waitFor(async () => (await world.messages()).find((m) => m.to.includes(elsewhere)));
    expect(notice.subject).toContain("Lanternfell Park");
    expect(notice.text).not.toContain("token=");
  });

  it("store nothing when the e-mail cannot be sent", async () => {
    const smtp = process.env.SMTP_URL;
    process.env.SMTP_URL = "smtp://127.0.0.1:9"; // discard port: nothing listens
    try {
      const err = await rejects(inviteUser(admin, { email: "unsent@lanternfell.example", name: "Un Sent", role: "viewer" }, BASE));
      expect(err.status).toBe(502);
    } finally {
      process.env.SMTP_URL = smtp;
    }
    expect(await getModels().User.findOne({ where: { email: "unsent@lanternfell.example" } })).toBeNull();
  });

  it("stop working once expired, and a re-sent link replaces the old one", async () => {
    await inviteUser(admin, { email: "late@lanternfell.example", name: "Late Comer", role: "trainer" }, BASE);
    const first = tokenFrom((await world.messages()).find((m) => m.to.includes("late@lanternfell.example"))!);
    const user = await getModels().User.findOne({ where: { email: "late@lanternfell.example" } });
    await resendInvite(admin, user!.id, BASE);
    const second = tokenFrom((await world.messages()).find((m) => m.to.includes("late@lanternfell.example"))!);
    expect(second).not.toBe(first);
    expect((await rejects(acceptInvite({ token: first, name: "Late Comer", password: "late-password-1" }))).status).toBe(400);

    await getModels().AuthToken.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { userId: user!.id, usedAt: null } });
    expect((await rejects(acceptInvite({ token: second, name: "Late Comer", password: "late-password-1" }))).status).toBe(400);
    expect((await getModels().User.findByPk(user!.id))?.passwordHash).toBeNull();
  });

  it("answer 404 for another organisation's user", async () => {
    const user = await getModels().User.findOne({ where: { email: "late@lanternfell.example" } });
    expect((await rejects(resendInvite(otherAdmin, user!.id, BASE))).status).toBe(404);
    expect((await rejects(updateUser(otherAdmin, user!.id, { role: "admin" }))).status).toBe(404);
  });
});

describe("password reset", () => {
  it("says nothing and sends nothing for an unknown address", async () => {
    const before = (await world.messages()).length;
    const r = await requestPasswordReset("nobody@lanternfell.example", "10.1.0.1", BASE);
    await r.sent;
    expect(r.allowed).toBe(true);
    expect((await world.messages()).length).toBe(before);
  });

  it("e-mails a one-hour link that sets a new password once and ends older sessions", async () => {
    const email = "new.engineer@lanternfell.example";
    const before = await getModels().User.findOne({ where: { email } });
    const r = await requestPasswordReset(email, "10.1.0.2", BASE);
    await r.sent;
    const mail = await waitFor(async () => (await world.messages()).find((m) => m.to.includes(email) && m.subject.includes("reset")));
    const token = tokenFrom(mail);
    const stored = await getModels().AuthToken.findOne({ where: { userId: before!.id, purpose: "reset", usedAt: null } });
    const minutes = (stored!.expiresAt.getTime() - Date.now()) / 60_000;
    expect(minutes).toBeGreaterThan(58);
    expect(minutes).toBeLessThanOrEqual(60);

    await resetPassword({ token, password: "take-up-travel-7" });
    expect(await loadActiveUser(before!.id, before!.sessionVersion)).toBeNull();
    expect((await checkCredentials({ email, password: "take-up-travel-7" }, "10.1.0.2")).ok).toBe(true);
    expect((await checkCredentials({ email, password: "chain-dog-42" }, "10.1.0.2")).ok).toBe(false);
    expect((await rejects(resetPassword({ token, password: "yet-another-pass" }))).status).toBe(400);
  });
});

describe("own password and profile", () => {
  it("needs the current password, and a change signs every session out", async () => {
    const me = await asCurrent("new.engineer@lanternfell.example");
    const wrong = await rejects(changeOwnPassword(me, { currentPassword: "not-the-password", newPassword: "fresh-password-9" }));
    expect(wrong.status).toBe(400);
    expect(wrong.issues[0].path).toBe("currentPassword");
    await changeOwnPassword(me, { currentPassword: "take-up-travel-7", newPassword: "fresh-password-9" });
    const row = await getModels().User.findByPk(me.id);
    expect(await verifyPassword("fresh-password-9", row?.passwordHash)).toBe(true);
    expect(await loadActiveUser(me.id, row!.sessionVersion - 1)).toBeNull();
    expect(await loadActiveUser(me.id, row!.sessionVersion)).not.toBeNull();
  });
});

describe("roles and deactivation", () => {
  it("won't let an admin demote or deactivate themselves", async () => {
    const demote = await rejects(updateUser(admin, admin.id, { role: "viewer" }));
    expect(demote.status).toBe(400);
    expect(demote.issues[0].path).toBe("role");
    const off = await rejects(updateUser(admin, admin.id, { active: false }));
    expect(off.issues[0].path).toBe("active");
    expect((await getModels().User.findByPk(admin.id))?.role).toBe("admin");
  });

  it("changes a role at once and a deactivated user's session stops working", async () => {
    const target = await asCurrent(demoAccount("trainer").email);
    const row = await getModels().User.findByPk(target.id);
    expect((await updateUser(admin, target.id, { role: "reviewer" })).role).toBe("reviewer");
    expect((await loadActiveUser(target.id, row!.sessionVersion))?.role).toBe("reviewer");

    await updateUser(admin, target.id, { active: false });
    expect(await loadActiveUser(target.id, row!.sessionVersion)).toBeNull();
    expect((await checkCredentials({ email: target.email, password: DEMO_PASSWORD }, "10.2.0.1")).ok).toBe(false);

    // Reactivating lets them sign in again, but the old session token stays dead.
    await updateUser(admin, target.id, { active: true, role: "trainer" });
    expect(await loadActiveUser(target.id, row!.sessionVersion)).toBeNull();
    expect((await checkCredentials({ email: target.email, password: DEMO_PASSWORD }, "10.2.0.1")).ok).toBe(true);
  });
});
