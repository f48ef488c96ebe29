import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { cachedRead } from "@/lib/http/read-cache";
import { parseJsonBody, parseQuery } from "@/lib/http/request";
import { createLift, listLifts } from "@/lib/lifts/service";

export const runtime = "nodejs";

/** Lifts of the organisation: ?page&pageSize&sort=name|site|createdAt|updatedAt&order&q&site&archived. */
export const GET = route(async (req) => {
  const actor = await requirePermission("design:read");
  return cachedRead(req, actor, async () => listLifts(actor, parseQuery(req)));
});

/** A new lift with revision 1. */
export const POST = route(async (req) => {
  const actor = await requirePermission("design:write");
  return NextResponse.json(await createLift(actor, await parseJsonBody(req)), { status: 201 });
});
