import { describe, expect, it } from "vitest";
import {
  acceptInviteSchema,
  changePasswordSchema,
  emailSchema,
  inviteUserSchema,
  profileSchema,
  resetPasswordSchema,
  signInSchema,
  updateUserSchema,
} from "@/lib/auth/schemas";
import { zodIssues } from "@/lib/http/errors";
import { generateToken } from "@/lib/auth/tokens";

function paths(r: { success: boolean; error?: Parameters<typeof zodIssues>[0] }): string[] {
  return r.success ? [] : zodIssues(r.error!).map((i) => i.path);
}

describe("auth schemas", () => {
  it("normalises e-mail addresses and rejects malformed ones with a plain message", () => {
    expect(emailSchema.parse("  Engineer@Lanternfell.EXAMPLE ")).toBe("engineer@lanternfell.example");
    const bad = emailSchema.safeParse("engineer-at-lanternfell");
    expect(bad.success).toBe(false);
    expect(bad.error!.issues[0].message).toMatch(/valid e-mail/);
  });

  it("names each missing sign-in field", () => {
    expect(paths(signInSchema.safeParse({}))).toEqual(["email", "password"]);
    expect(paths(signInSchema.safeParse({ email: "a@lanternfell.example", password: "" }))).toEqual(["password"]);
  });

  it("asks for passwords of 10 characters up to 72 bytes, without edge spaces", () => {
    const token = generateToken();
    expect(paths(resetPasswordSchema.safeParse({ token, password: "short" }))).toEqual(["password"]);
    expect(paths(resetPasswordSchema.safeParse({ token, password: "x".repeat(73) }))).toEqual(["password"]);
    // 24 three-byte characters are 72 bytes: allowed; 25 are not.
    expect(resetPasswordSchema.safeParse({ token, password: "€".repeat(24) }).success).toBe(true);
    expect(resetPasswordSchema.safeParse({ token, password: "€".repeat(25) }).success).toBe(false);
    expect(paths(resetPasswordSchema.safeParse({ token, password: " padded-password " }))).toEqual(["password"]);
    expect(resetPasswordSchema.safeParse({ token, password: "long-enough-1" }).success).toBe(true);
  });

  it("rejects tokens that are not a whole link token", () => {
    expect(paths(resetPasswordSchema.safeParse({ token: "abc", password: "long-enough-1" }))).toEqual(["token"]);
    expect(paths(acceptInviteSchema.safeParse({ token: generateToken() + "x", name: "A", password: "long-enough-1" }))).toEqual(["token"]);
  });

  it("checks invitations field by field", () => {
    expect(paths(inviteUserSchema.safeParse({ email: "nope", name: " ", role: "owner" }))).toEqual(["email", "name", "role"]);
    expect(inviteUserSchema.parse({ email: "New@Lanternfell.example", name: " Ada ", role: "trainer" })).toEqual({
      email: "new@lanternfell.example",
      name: "Ada",
      role: "trainer",
    });
  });

  it("needs something to change on a user or a profile, and nothing unknown", () => {
    expect(paths(updateUserSchema.safeParse({}))).toEqual(["(body)"]);
    expect(updateUserSchema.safeParse({ role: "viewer", extra: 1 }).success).toBe(false);
    expect(paths(updateUserSchema.safeParse({ active: "no" }))).toEqual(["active"]);
    expect(paths(profileSchema.safeParse({ units: "imperial" }))).toEqual(["units"]);
    expect(profileSchema.parse({ units: "us" })).toEqual({ units: "us" });
  });

  it("refuses a new password equal to the current one, on the new-password field", () => {
    const r = changePasswordSchema.safeParse({ currentPassword: "same-password", newPassword: "same-password" });
    expect(paths(r)).toEqual(["newPassword"]);
  });
});
