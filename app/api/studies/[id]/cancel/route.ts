import { NextResponse } from "next/server";
import { route } from "@/lib/http/route";
import { requirePermission } from "@/lib/auth/session";
import { cancelStudy } from "@/lib/studies/service";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** Cancels the study's waiting and running cases; finished cases are kept. 409 when already finished. */
export const POST = route<RouteContext>(async (_req, ctx) => {
  const user = await requirePermission("study:run");
  return NextResponse.json({ study: await cancelStudy(user, parseId((await ctx.params).id, "Study not found.")) });
});
