import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { cachedRead } from "@/lib/http/read-cache";
import { parseJsonBody } from "@/lib/http/request";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { deleteScenario, getScenario, updateScenario } from "@/lib/scenarios/service";

export const runtime = "nodejs";

export const GET = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("design:read");
  return cachedRead(req, actor, async () => getScenario(actor, parseId((await ctx.params).id, "Scenario not found.")));
});

/** Partial update with the version edited; a frozen scenario answers 409. */
export const PATCH = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("design:write");
  const id = parseId((await ctx.params).id, "Scenario not found.");
  return NextResponse.json(await updateScenario(actor, id, await parseJsonBody(req)));
});

/** Deletes a scenario without runs or comments; archives one with them. */
export const DELETE = route(async (_req, ctx: RouteContext) => {
  const actor = await requirePermission("design:write");
  return NextResponse.json(await deleteScenario(actor, parseId((await ctx.params).id, "Scenario not found.")));
});
