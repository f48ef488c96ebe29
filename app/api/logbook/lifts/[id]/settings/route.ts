import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseJsonBody } from "@/lib/http/request";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { updateSettings } from "@/lib/logbook/service";

export const runtime = "nodejs";

/** Per-lift levels: elongation limit and warning (%), take-up warning (fraction), forecast horizon (days). */
export const PUT = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("logbook:settings");
  const id = parseId((await ctx.params).id, "Lift not found.");
  return NextResponse.json(await updateSettings(actor, id, await parseJsonBody(req)));
});
