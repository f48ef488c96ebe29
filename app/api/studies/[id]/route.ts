import { NextResponse } from "next/server";
import { route } from "@/lib/http/route";
import { parseQuery } from "@/lib/http/request";
import { requirePermission } from "@/lib/auth/session";
import { getStudy } from "@/lib/studies/service";
import { unitsQuerySchema } from "@/lib/studies/http";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** The study with progress, time left, every case and the operating window (?units=si|us for the sentence). */
export const GET = route<RouteContext>(async (req, ctx) => {
  const user = await requirePermission("study:read");
  const id = parseId((await ctx.params).id, "Study not found.");
  const { units } = parseQuery(req, unitsQuerySchema);
  return NextResponse.json({ study: await getStudy(user, id, { units }) });
});
