import { NextResponse } from "next/server";
import { route } from "@/lib/http/route";
import { requirePermission } from "@/lib/auth/session";
import { getReport } from "@/lib/reports/service";
import { idFrom, type IdParams } from "@/lib/runs/http";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** The report with its review trail (submit, return with comments, approve). */
export const GET = route<IdParams>(async (_req, ctx) => {
  const user = await requirePermission("report:read");
  return NextResponse.json({ report: await getReport(user, await idFrom(ctx, "No such report.")) });
});
