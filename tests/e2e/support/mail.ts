import type { FakeMessage } from "@/lib/mail/fake-server";

const mailFakeUrl = (process.env.MAIL_FAKE_URL ?? `http://127.0.0.1:${process.env.TEST_MAIL_HTTP_PORT ?? 1081}`).replace(/\/+$/, "");

/** Waits until the local mail fake holds a message to `to` whose subject contains `subject`. */
export async function waitForMail(to: string, subject: string, timeoutMs = 10_000): Promise<FakeMessage> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const res = await fetch(`${mailFakeUrl}/messages`);
    if (!res.ok) throw new Error(`Mail fake at ${mailFakeUrl} answered ${res.status}`);
    const found = ((await res.json()) as FakeMessage[]).find((m) => m.to.includes(to) && m.subject.includes(subject));
    if (found) return found;
    if (Date.now() > until) throw new Error(`No e-mail "${subject}" to ${to} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 150));
  }
}

export async function mailsTo(to: string): Promise<FakeMessage[]> {
  const res = await fetch(`${mailFakeUrl}/messages`);
  return ((await res.json()) as FakeMessage[]).filter((m) => m.to.includes(to));
}

/** The first link in the message's plain text. */
export function linkIn(message: FakeMessage): string {
  const m = /https?:\/\/\S+/.exec(message.text);
  if (!m) throw new Error(`No link in "${message.subject}"`);
  return m[0];
}
