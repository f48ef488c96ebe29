import { afterAll, beforeAll, describe, expect, it } from "vitest";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import nodemailer from "nodemailer";
import { startMailFake, type MailFake } from "@/lib/mail/fake-server";
import { clearOrganisationMail, listFakeMessages, listOrganisationMail } from "@/lib/mail/mailbox";
import { getModels } from "@/models";
import { closeDb, makeOrganisation } from "./design-fixtures";

// Two organisations on one instance share the development mail fake. Source: the access rule in
// README's security section (an administrator reads only their own organisation's people's mail).
let fake: MailFake;
let base = "";
let dir = "";
let a: Awaited<ReturnType<typeof makeOrganisation>>;
let b: Awaited<ReturnType<typeof makeOrganisation>>;
const emails: Record<string, string> = {};

async function send(to: string | string[], subject: string) {
  const t = nodemailer.createTransport({ host: "127.0.0.1", port: fake.smtpPort, secure: false, ignoreTLS: true });
  await t.sendMail({ from: "Tautline <no-reply@tautline.example>", to, subject, text: `link: http://127.0.0.1/reset-password?token=${subject}` });
  t.close();
}

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "tautline-mailbox-"));
  fake = await startMailFake({ smtpPort: 0, httpPort: 0, dir });
  base = `http://127.0.0.1:${fake.httpPort}`;
  a = await makeOrganisation("mail-a");
  b = await makeOrganisation("mail-b");
  const { User } = getModels();
  for (const [key, id] of [["aAdmin", a.as.admin.id], ["aViewer", a.as.viewer.id], ["bAdmin", b.as.admin.id], ["bEngineer", b.as.engineer.id]] as const) {
    emails[key] = (await User.findByPk(id))!.email;
  }
  await send(emails.aViewer, "a-reset");
  // Mixed case on the wire: addresses compare without case.
  await send(emails.aAdmin.toUpperCase(), "a-invite");
  await send(emails.bEngineer, "b-reset");
  await send(emails.bAdmin, "b-invite");
  await send("nobody@elsewhere.example", "unknown");
  await send([emails.aViewer, emails.bEngineer], "both");
});

afterAll(async () => {
  await fake.close();
  fs.rmSync(dir, { recursive: true, force: true });
  await closeDb();
});

describe("the development mailbox of an administrator", () => {
  it("shows only the mail of their own organisation's people", async () => {
    const seen = (await listOrganisationMail(a.organisationId, base)).map((m) => m.subject).sort();
    expect(seen).toEqual(["a-invite", "a-reset"]);
    const other = (await listOrganisationMail(b.organisationId, base)).map((m) => m.subject).sort();
    expect(other).toEqual(["b-invite", "b-reset"]);
  });

  it("deletes only their own organisation's mail; the other organisation's reset link stays with it", async () => {
    expect(await clearOrganisationMail(a.organisationId, base)).toBe(2);
    expect(await listOrganisationMail(a.organisationId, base)).toEqual([]);
    const left = (await listFakeMessages(base)).map((m) => m.subject).sort();
    expect(left).toEqual(["b-invite", "b-reset", "both", "unknown"]);
  });
});
