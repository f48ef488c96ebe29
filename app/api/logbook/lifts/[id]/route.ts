import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { getTrend } from "@/lib/logbook/service";

export const runtime = "nodejs";

/** The lift's trend: elongation and take-up series, levels, forecasts with their 95 % interval, open alerts. */
export const GET = route(async (_req, ctx: RouteContext) => {
  const actor = await requirePermission("logbook:read");
  return NextResponse.json(await getTrend(actor, parseId((await ctx.params).id, "Lift not found.")));
});
