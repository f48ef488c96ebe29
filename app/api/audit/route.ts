import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseQuery } from "@/lib/http/request";
import { listAudit } from "@/lib/audit/list";

export const runtime = "nodejs";

/** The organisation's audit trail: ?entity&entityId&action&userId&from&to&sort=at|entity|action&order&page&pageSize. */
export const GET = route(async (req) => {
  const actor = await requirePermission("audit:read");
  return NextResponse.json(await listAudit(actor, parseQuery(req)));
});
