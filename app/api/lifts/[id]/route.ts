import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { cachedRead } from "@/lib/http/read-cache";
import { parseJsonBody } from "@/lib/http/request";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { deleteLift, getLift, updateLift } from "@/lib/lifts/service";

export const runtime = "nodejs";

export const GET = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("design:read");
  return cachedRead(req, actor, async () => getLift(actor, parseId((await ctx.params).id, "Lift not found.")));
});

/** Saves the lift as a new revision; the body carries the version it edits. */
export const PATCH = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("design:write");
  const id = parseId((await ctx.params).id, "Lift not found.");
  return NextResponse.json(await updateLift(actor, id, await parseJsonBody(req)));
});

/** Deletes an unused lift; archives one that scenarios use. */
export const DELETE = route(async (_req, ctx: RouteContext) => {
  const actor = await requirePermission("design:write");
  return NextResponse.json(await deleteLift(actor, parseId((await ctx.params).id, "Lift not found.")));
});
