import { NextResponse } from "next/server";
import { route } from "@/lib/http/route";
import { requirePermission } from "@/lib/auth/session";
import { reportPdf } from "@/lib/reports/service";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** The PDF: the stamped file of an approved report, else drawn from the current content. */
export const GET = route<RouteContext>(async (_req, ctx) => {
  const user = await requirePermission("report:read");
  const { pdf, filename } = await reportPdf(user, parseId((await ctx.params).id, "Report not found."));
  return new NextResponse(new Uint8Array(pdf), {
    headers: { "Content-Type": "application/pdf", "Content-Disposition": `inline; filename="${filename}"` },
  });
});
