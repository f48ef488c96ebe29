import { NextResponse } from "next/server";
import { isProductionInstance } from "@/lib/auth/secret";
import { requirePermission } from "@/lib/auth/session";
import { notFound, unavailable } from "@/lib/http/errors";
import { clearFakeMessages, listFakeMessages, mailFakeUrl } from "@/lib/mail/mailbox";
import { route } from "@/lib/http/route";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** The development mailbox exists only on non-production instances that run the mail fake. */
async function mailbox(): Promise<string> {
  if (isProductionInstance()) throw notFound();
  await requirePermission("devmail:read");
  const base = mailFakeUrl();
  if (!base) throw unavailable("No local mail fake is configured (MAIL_FAKE_URL is empty).");
  return base;
}

export const GET = route(async () => {
  const base = await mailbox();
  const messages = await listFakeMessages(base).catch(() => {
    throw unavailable(`The local mail fake at ${base} does not answer.`);
  });
  return NextResponse.json({ messages });
});

export const DELETE = route(async () => {
  const base = await mailbox();
  await clearFakeMessages(base).catch(() => {
    throw unavailable(`The local mail fake at ${base} does not answer.`);
  });
  return NextResponse.json({ deleted: true });
});
