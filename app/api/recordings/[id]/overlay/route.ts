import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseQuery } from "@/lib/http/request";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { overlay } from "@/lib/recordings/service";

export const runtime = "nodejs";

/** The recording's take-up trace beside a run's (?runId=), aligned at engagement. */
export const GET = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("logbook:read");
  const id = parseId((await ctx.params).id, "Recording not found.");
  return NextResponse.json(await overlay(actor, id, parseQuery(req).runId));
});
