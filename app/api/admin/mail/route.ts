import { NextResponse } from "next/server";
import { isProductionInstance } from "@/lib/auth/secret";
import { requirePermission } from "@/lib/auth/session";
import { notFound, unavailable } from "@/lib/http/errors";
import { clearOrganisationMail, listOrganisationMail, mailFakeUrl } from "@/lib/mail/mailbox";
import { route } from "@/lib/http/route";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/**
 * The development mailbox exists only on non-production instances that run the mail fake, and shows an
 * administrator only the mail of their own organisation's people (lib/mail/mailbox.ts).
 */
async function mailbox(): Promise<{ base: string; organisationId: number }> {
  if (isProductionInstance()) throw notFound();
  const user = await requirePermission("devmail:read");
  const base = mailFakeUrl();
  if (!base) throw unavailable("No local mail fake is configured (MAIL_FAKE_URL is empty).");
  return { base, organisationId: user.organisationId };
}

export const GET = route(async () => {
  const { base, organisationId } = await mailbox();
  const messages = await listOrganisationMail(organisationId, base).catch(() => {
    throw unavailable(`The local mail fake at ${base} does not answer.`);
  });
  return NextResponse.json({ messages });
});

export const DELETE = route(async () => {
  const { base, organisationId } = await mailbox();
  const deleted = await clearOrganisationMail(organisationId, base).catch(() => {
    throw unavailable(`The local mail fake at ${base} does not answer.`);
  });
  return NextResponse.json({ deleted: true, count: deleted });
});
