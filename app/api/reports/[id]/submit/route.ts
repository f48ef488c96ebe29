import { NextResponse } from "next/server";
import { route } from "@/lib/http/route";
import { requirePermission } from "@/lib/auth/session";
import { submitReport } from "@/lib/review/service";
import { idFrom, type IdParams } from "@/lib/runs/http";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** The author submits a draft or returned report for review. */
export const POST = route<IdParams>(async (_req, ctx) => {
  const user = await requirePermission("report:write");
  const id = await idFrom(ctx, "No such report.");
  return NextResponse.json({ report: await submitReport(user, id) });
});
