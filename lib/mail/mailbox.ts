import type { FakeMessage } from "./fake-server";

export type { FakeMessage } from "./fake-server";

/** Where the local mail fake serves its messages, or null when this instance has none (production). */
export function mailFakeUrl(env: Readonly<Record<string, string | undefined>> = process.env): string | null {
  return env.MAIL_FAKE_URL?.replace(/\/+$/, "") || null;
}

/** Messages kept by the local mail fake, newest first. */
export async function listFakeMessages(base: string): Promise<FakeMessage[]> {
  const res = await fetch(`${base}/messages`, { cache: "no-store", signal: AbortSignal.timeout(5_000) });
  if (!res.ok) throw new Error(`The mail fake answered ${res.status}.`);
  return (await res.json()) as FakeMessage[];
}

export async function clearFakeMessages(base: string): Promise<void> {
  const res = await fetch(`${base}/messages`, { method: "DELETE", signal: AbortSignal.timeout(5_000) });
  if (!res.ok) throw new Error(`The mail fake answered ${res.status}.`);
}
