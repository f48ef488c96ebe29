import { NextResponse } from "next/server";
import { route } from "@/lib/http/route";
import { requirePermission } from "@/lib/auth/session";
import { getReport } from "@/lib/reports/service";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** The report with its review trail (submit, return with comments, approve). */
export const GET = route<RouteContext>(async (_req, ctx) => {
  const user = await requirePermission("report:read");
  return NextResponse.json({ report: await getReport(user, parseId((await ctx.params).id, "Report not found.")) });
});
