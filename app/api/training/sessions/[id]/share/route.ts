import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseJsonBody } from "@/lib/http/request";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { shareSession } from "@/lib/training/service";

export const runtime = "nodejs";

/** Shares the session with the organisation's viewers (e-mailed) and invites `invite` addresses of the organisation. */
export const POST = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("training:manage");
  const id = parseId((await ctx.params).id, "Session not found.");
  return NextResponse.json(await shareSession(actor, id, await parseJsonBody(req)));
});
