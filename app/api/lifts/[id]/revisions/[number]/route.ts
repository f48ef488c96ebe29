import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseQuery } from "@/lib/http/request";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { getRevision } from "@/lib/lifts/service";

export const runtime = "nodejs";

/** One revision by its number, with the field changes from the one before (or from ?compare=N). */
export const GET = route(async (req, ctx: RouteContext<{ id: string; number: string }>) => {
  const actor = await requirePermission("design:read");
  const p = await ctx.params;
  return NextResponse.json(
    await getRevision(actor, parseId(p.id, "Lift not found."), parseId(p.number, "Revision not found."), parseQuery(req)),
  );
});
