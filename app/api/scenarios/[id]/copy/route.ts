import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseJsonBody } from "@/lib/http/request";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { copyScenario } from "@/lib/scenarios/service";

export const runtime = "nodejs";

/** A copy of the scenario pinned to the same lift revision; body `{ name? }`. */
export const POST = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("design:write");
  const id = parseId((await ctx.params).id, "Scenario not found.");
  return NextResponse.json(await copyScenario(actor, id, await parseJsonBody(req)), { status: 201 });
});
