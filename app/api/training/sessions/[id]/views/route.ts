import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseJsonBody } from "@/lib/http/request";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { recordView, sessionProgress } from "@/lib/training/service";

export const runtime = "nodejs";

/** Who has watched what (trainers). */
export const GET = route(async (_req, ctx: RouteContext) => {
  const actor = await requirePermission("training:manage");
  return NextResponse.json({ progress: await sessionProgress(actor, parseId((await ctx.params).id, "Session not found.")) });
});

/** The caller's progress on one item: { itemId, watchedTo, completed? }. */
export const POST = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("training:watch");
  const id = parseId((await ctx.params).id, "Session not found.");
  return NextResponse.json(await recordView(actor, id, await parseJsonBody(req)));
});
