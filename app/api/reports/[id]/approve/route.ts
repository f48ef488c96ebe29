import { NextResponse } from "next/server";
import { z } from "zod";
import { parseJsonBody } from "@/lib/http/request";
import { route } from "@/lib/http/route";
import { requirePermission } from "@/lib/auth/session";
import { approveReport } from "@/lib/review/service";
import { idFrom, type IdParams } from "@/lib/runs/http";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** A reviewer who is not the author approves: stamps, stores the PDF, freezes the scenario, e-mails the author. Body { comment? } */
export const POST = route<IdParams>(async (req, ctx) => {
  const user = await requirePermission("report:review");
  const id = await idFrom(ctx, "No such report.");
  return NextResponse.json({ report: await approveReport(user, id, await parseJsonBody(req, z.unknown())) });
});
