import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { openAlerts } from "@/lib/alerts/notify";

export const runtime = "nodejs";

/** Open alerts of the caller's organisation. */
export const GET = route(async () => {
  const actor = await requirePermission("logbook:read");
  return NextResponse.json({ alerts: await openAlerts(actor.organisationId) });
});
