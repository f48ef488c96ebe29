import { describe, expect, it } from "vitest";
import { inviteMail, resetMail } from "@/lib/mail/templates";
import { authSecret, isProductionInstance, MissingSecretError } from "@/lib/auth/secret";

describe("mail templates", () => {
  const link = "http://127.0.0.1:3000/accept-invite?token=abc_DEF-123";

  it("carry the product name, the link in text and HTML, and the validity", () => {
    const m = inviteMail({
      inviteeName: "Ada",
      inviterName: "Mira",
      organisationName: "Lanternfell Park",
      role: "engineer",
      link,
      validForMs: 72 * 3_600_000,
    });
    expect(m.subject).toBe("Tautline: you are invited to Lanternfell Park");
    expect(m.text).toContain(link);
    expect(m.text).toContain("Ride engineer");
    expect(m.text).toContain("72 hours");
    expect(m.html).toContain(`href="${link}"`);
    expect(m.html).toContain("Tautline");
  });

  it("escapes names in HTML", () => {
    const m = resetMail({ name: "<b>Ada</b> & co", link, validForMs: 3_600_000 });
    expect(m.html).toContain("&lt;b&gt;Ada&lt;/b&gt; &amp; co");
    expect(m.html).not.toContain("<b>Ada</b>");
    expect(m.text).toContain("1 hour");
  });
});

describe("auth secret", () => {
  it("refuses production without NEXTAUTH_SECRET and uses the configured one", () => {
    expect(() => authSecret({ NODE_ENV: "production" })).toThrow(MissingSecretError);
    expect(authSecret({ NODE_ENV: "production", NEXTAUTH_SECRET: "s3cret" })).toBe("s3cret");
    expect(authSecret({ NODE_ENV: "development" })).toMatch(/not-for-production/);
  });

  it("treats an instance as live only when TAUTLINE_ENV says so", () => {
    expect(isProductionInstance({ NODE_ENV: "production" })).toBe(false);
    expect(isProductionInstance({ TAUTLINE_ENV: "production" })).toBe(true);
  });
});
