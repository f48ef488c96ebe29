import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { getRecording } from "@/lib/recordings/service";

export const runtime = "nodejs";

export const GET = route(async (_req, ctx: RouteContext) => {
  const actor = await requirePermission("logbook:read");
  return NextResponse.json(await getRecording(actor, parseId((await ctx.params).id, "Recording not found.")));
});
