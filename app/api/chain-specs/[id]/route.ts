import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { cachedRead } from "@/lib/http/read-cache";
import { parseJsonBody } from "@/lib/http/request";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { deleteChainSpec, getChainSpec, updateChainSpec } from "@/lib/chains/service";

export const runtime = "nodejs";

export const GET = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("design:read");
  return cachedRead(req, actor, async () => getChainSpec(actor, parseId((await ctx.params).id, "Chain not found.")));
});

/** Updates one of the organisation's own chains (the standard catalogue is read-only). */
export const PATCH = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("design:write");
  const id = parseId((await ctx.params).id, "Chain not found.");
  return NextResponse.json(await updateChainSpec(actor, id, await parseJsonBody(req)));
});

export const DELETE = route(async (_req, ctx: RouteContext) => {
  const actor = await requirePermission("design:write");
  return NextResponse.json(await deleteChainSpec(actor, parseId((await ctx.params).id, "Chain not found.")));
});
