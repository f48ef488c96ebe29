/**
 * The development mailbox as the app shows it (non-production instances with the local mail fake). An
 * administrator sees only messages whose every recipient is a member or invitee of their own
 * organisation, and deletes only those: another organisation's reset or invitation link never reaches them.
 */
import { Op } from "sequelize";
import { getModels } from "@/models";
import type { FakeMessage } from "./fake-server";

export type { FakeMessage } from "./fake-server";

/** Where the local mail fake serves its messages, or null when this instance has none (production). */
export function mailFakeUrl(env: Readonly<Record<string, string | undefined>> = process.env): string | null {
  return env.MAIL_FAKE_URL?.replace(/\/+$/, "") || null;
}

/** Messages kept by the local mail fake, newest first (all organisations': operator use only). */
export async function listFakeMessages(base: string): Promise<FakeMessage[]> {
  const res = await fetch(`${base}/messages`, { cache: "no-store", signal: AbortSignal.timeout(5_000) });
  if (!res.ok) throw new Error(`The mail fake answered ${res.status}.`);
  return (await res.json()) as FakeMessage[];
}

/** Deletes the given messages from the fake (all of them when `ids` is absent: operator use only). */
export async function clearFakeMessages(base: string, ids?: readonly string[]): Promise<void> {
  if (ids && !ids.length) return;
  const query = ids ? `?${ids.map((id) => `id=${encodeURIComponent(id)}`).join("&")}` : "";
  const res = await fetch(`${base}/messages${query}`, { method: "DELETE", signal: AbortSignal.timeout(5_000) });
  if (!res.ok) throw new Error(`The mail fake answered ${res.status}.`);
}

/** The messages of `messages` whose every recipient has an account (or invitation) in the organisation. */
async function ofOrganisation(organisationId: number, messages: FakeMessage[]): Promise<FakeMessage[]> {
  const addresses = [...new Set(messages.flatMap((m) => m.to.map((a) => a.toLowerCase())))];
  if (!addresses.length) return [];
  const members = await getModels().User.findAll({
    where: { organisationId, email: { [Op.in]: addresses } },
    attributes: ["email"],
  });
  const own = new Set(members.map((u) => u.email.toLowerCase()));
  return messages.filter((m) => m.to.length > 0 && m.to.every((a) => own.has(a.toLowerCase())));
}

/** The organisation's messages in the mail fake, newest first. */
export async function listOrganisationMail(organisationId: number, base: string): Promise<FakeMessage[]> {
  return ofOrganisation(organisationId, await listFakeMessages(base));
}

/** Deletes the organisation's messages (others' stay); answers how many went. */
export async function clearOrganisationMail(organisationId: number, base: string): Promise<number> {
  const mine = await listOrganisationMail(organisationId, base);
  // A long list goes in batches so the query string stays short.
  for (let i = 0; i < mine.length; i += 50) await clearFakeMessages(base, mine.slice(i, i + 50).map((m) => m.id));
  return mine.length;
}
