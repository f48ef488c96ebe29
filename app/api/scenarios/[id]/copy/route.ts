import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { readObjectBody } from "@/lib/api/body";
import { parseId } from "@/lib/api/ids";
import type { RouteContext } from "@/lib/api/params";
import { copyScenario } from "@/lib/scenarios/service";

export const runtime = "nodejs";

/** A copy of the scenario pinned to the same lift revision; body `{ name? }`. */
export const POST = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("design:write");
  const id = parseId((await ctx.params).id, "Scenario not found.");
  return NextResponse.json(await copyScenario(actor, id, await readObjectBody(req)), { status: 201 });
});
