import { NextResponse } from "next/server";
import { route } from "@/lib/http/route";
import { requirePermission } from "@/lib/auth/session";
import { cancelRun } from "@/lib/runs/service";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** Cancels a queued or running run (409 when it has already finished). */
export const POST = route<RouteContext>(async (_req, ctx) => {
  const user = await requirePermission("run:cancel");
  return NextResponse.json(await cancelRun(user, parseId((await ctx.params).id, "Run not found.")));
});
