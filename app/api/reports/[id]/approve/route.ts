import { NextResponse } from "next/server";
import { z } from "zod";
import { parseJsonBody } from "@/lib/http/request";
import { route } from "@/lib/http/route";
import { requirePermission } from "@/lib/auth/session";
import { approveReport } from "@/lib/review/service";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** A reviewer who is not the author approves: stamps, stores the PDF, freezes the scenario, e-mails the author. Body { comment? } */
export const POST = route<RouteContext>(async (req, ctx) => {
  const user = await requirePermission("report:review");
  const id = parseId((await ctx.params).id, "Report not found.");
  return NextResponse.json({ report: await approveReport(user, id, await parseJsonBody(req, z.unknown())) });
});
