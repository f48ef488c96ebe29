import { NextResponse } from "next/server";
import { route } from "@/lib/http/route";
import { requirePermission } from "@/lib/auth/session";
import { submitReport } from "@/lib/review/service";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** The author submits a draft or returned report for review. */
export const POST = route<RouteContext>(async (_req, ctx) => {
  const user = await requirePermission("report:write");
  const id = parseId((await ctx.params).id, "Report not found.");
  return NextResponse.json({ report: await submitReport(user, id) });
});
