import fs from "node:fs";
import path from "node:path";
import { repoRoot, type Stack } from "./settings";
import { say, warn } from "./log";

export interface MailFake {
  close(): Promise<void>;
}

type StartMailFake = (o: { smtpPort: number; httpPort: number; dir: string }) => Promise<MailFake>;

/**
 * Starts the local SMTP fake from lib/mail/fake-server.ts when that module exists (null otherwise,
 * with a warning), so the start and test commands work while the mail part is still being written.
 */
export async function startMailFakeIfPresent(s: Stack): Promise<MailFake | null> {
  if (!s.runMailFake) {
    say(`SMTP_URL points at ${s.smtpUrl}: not starting the local mail fake`);
    return null;
  }
  const file = path.join(repoRoot, "lib", "mail", "fake-server.ts");
  if (!fs.existsSync(file)) {
    warn("lib/mail/fake-server.ts does not exist yet: e-mail is not captured");
    return null;
  }
  // A computed specifier keeps the type checker from requiring the module before it exists.
  const specifier = file;
  const mod = (await import(specifier)) as { startMailFake?: StartMailFake };
  if (typeof mod.startMailFake !== "function") {
    warn("lib/mail/fake-server.ts has no startMailFake export: e-mail is not captured");
    return null;
  }
  fs.mkdirSync(s.mailDir, { recursive: true });
  const fake = await mod.startMailFake({ smtpPort: s.smtpPort, httpPort: s.mailHttpPort, dir: s.mailDir });
  say(`mail fake: SMTP on 127.0.0.1:${s.smtpPort}, messages at ${s.mailFakeUrl}`);
  return fake;
}
